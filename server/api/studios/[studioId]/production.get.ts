import type { ProductionItem } from '#shared/types/plan'
import { studioParams } from '#shared/validation/auth'

// Who is knitting what in the studio, how far and how fast: owners and designers.
export default defineEventHandler(async (event): Promise<ProductionItem[]> => {
  await requireUser(event)
  const { studioId } = paramsValid(event, studioParams)
  await studioMember(event, studioId, 'designer')
  return studioProduction(studioId)
})
