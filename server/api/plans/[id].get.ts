import { idParams } from '#shared/validation/common'

// The plan with the engine's numbers per piece, warnings and the yarn estimate against stock.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { plan, role } = await requirePlan(event, id)
  setVersionTag(event, plan.version)
  return planDetail(plan, role)
})
