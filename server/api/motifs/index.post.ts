import { studioRef } from '#shared/validation/common'
import { motifCreateBody } from '#shared/validation/motifs'
import { Motif } from '../../db/models'
import { motifRecord } from '../../db/motifs'

// A new motif from chart rows (rows[0] first knitted). Designers and owners only.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  // The studio is checked before the rest of the body, so a stranger learns nothing from errors.
  const { studioId } = await readValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  const body = await readValid(event, motifCreateBody)
  const motif = await Motif.create({
    studioId, name: body.name, published: body.published ?? false,
    createdBy: user.id, updatedBy: user.id, ...motifRecord(body.rows),
  })
  setResponseStatus(event, 201)
  return loadMotifDetail(motif.id)
})
