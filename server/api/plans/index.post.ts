import { studioRef } from '#shared/validation/common'
import { planBody } from '#shared/validation/plans'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { studioId } = await readValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  const body = await readValid(event, planBody)
  await checkPlanRefs(studioId, body)
  const id = await createPlan(body, user.id)
  setResponseStatus(event, 201)
  return loadPlanDetail(id)
})
