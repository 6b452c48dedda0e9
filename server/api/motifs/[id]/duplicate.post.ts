import { idParams } from '#shared/validation/common'
import { motifDuplicateBody } from '#shared/validation/motifs'
import { Motif } from '../../../db/models'

// A copy to change without touching the original: a draft, without the original picture.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { motif } = await requireMotif(event, id, 'designer')
  const body = await readValid(event, motifDuplicateBody)
  const copy = await Motif.create({
    studioId: motif.studioId, name: body?.name ?? `${motif.name.slice(0, 113)} (copy)`, published: false,
    width: motif.width, height: motif.height, cells: motif.cells,
    floatReport: motif.floatReport, verdict: motif.verdict, longestFloat: motif.longestFloat,
    createdBy: user.id, updatedBy: user.id,
  })
  setResponseStatus(event, 201)
  return loadMotifDetail(copy.id)
})
