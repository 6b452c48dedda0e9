import type { MotifPage } from '#shared/types/motif'
import { motifListQuery } from '#shared/validation/motifs'

// A page of a studio's motif library: knitters see the published ones, designers and owners all.
export default defineEventHandler(async (event): Promise<MotifPage> => {
  await requireUser(event)
  const query = queryValid(event, motifListQuery)
  const { role } = await studioMember(event, query.studioId)
  return motifPage(query, role)
})
