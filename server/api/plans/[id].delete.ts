import { idParams } from '#shared/validation/common'

// Projects started from the plan keep their own snapshot.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { plan } = await requirePlan(event, id, 'designer')
  await plan.destroy()
  setResponseStatus(event, 204)
  return null
})
