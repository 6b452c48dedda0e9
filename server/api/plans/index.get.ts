import type { PlanSummary } from '#shared/types/plan'
import { studioRef } from '#shared/validation/common'

// A studio's plans, most recently changed first; knitters see the published ones.
export default defineEventHandler(async (event): Promise<PlanSummary[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioRef)
  const { role } = await studioMember(event, studioId)
  return listPlans(studioId, role)
})
