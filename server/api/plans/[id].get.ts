import { idParams } from '#shared/validation/common'
import { planSizeQuery } from '#shared/validation/plans'

// The plan with the engine's numbers per piece for one of its sizes (`?size=`, the first by
// default), warnings and the yarn estimate against stock.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { plan, role } = await requirePlan(event, id)
  const { size } = queryValid(event, planSizeQuery)
  if (size !== undefined && size >= plan.sizes.length) throw fieldError('size', `the plan has no size ${size} (it has ${plan.sizes.length}: ${plan.sizes.join(', ')})`)
  setVersionTag(event, plan.version)
  return planDetail(plan, role, size)
})
