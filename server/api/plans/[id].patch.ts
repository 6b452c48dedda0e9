import { idParams } from '#shared/validation/common'
import { planPatch } from '#shared/validation/plans'

// Any field, including `published`; `pieces` replaces every piece.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { plan } = await requirePlan(event, id, 'designer')
  const body = await readValid(event, planPatch)
  await checkPlanRefs(plan.studioId, body)
  await updatePlan(plan, body, user.id)
  return loadPlanDetail(plan.id)
})
