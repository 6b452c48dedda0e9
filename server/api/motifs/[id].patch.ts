import { idParams } from '#shared/validation/common'
import { motifPatchBody } from '#shared/validation/motifs'
import { motifRecord } from '../../db/motifs'

// Rename, redraw or (un)publish. New rows bring a new float report.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { motif } = await requireMotif(event, id, 'designer')
  const body = await readValid(event, motifPatchBody)
  if (body.name !== undefined) motif.name = body.name
  if (body.published !== undefined) motif.published = body.published
  if (body.rows !== undefined) motif.set(motifRecord(body.rows))
  motif.updatedBy = user.id
  await motif.save()
  return loadMotifDetail(motif.id)
})
