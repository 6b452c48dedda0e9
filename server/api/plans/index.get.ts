import type { PlanSummary } from '#shared/types/plan'
import { studioQuery } from '#shared/validation/library'

// A studio's plans, most recently changed first; knitters see the published ones.
export default defineEventHandler(async (event): Promise<PlanSummary[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioQuery)
  const { role } = await studioMember(event, studioId)
  return listPlans(studioId, role)
})
