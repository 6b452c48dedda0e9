import type { ProductionItem } from '#shared/types/plan'
import { studioRef } from '#shared/validation/common'

// Who is knitting what in the studio, how far and how fast: owners and designers.
export default defineEventHandler(async (event): Promise<ProductionItem[]> => {
  await requireUser(event)
  const { studioId } = paramsValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  return studioProduction(studioId)
})
