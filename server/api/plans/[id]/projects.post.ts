import { idParams } from '#shared/validation/common'
import { planProjectBody } from '#shared/validation/plans'

// Any member who can see the published plan starts a project from it and knits it.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { plan, role } = await requirePlan(event, id)
  const body = await readValid(event, planProjectBody)
  const projectId = await startProjectFromPlan(plan, body, user.id, role)
  setResponseStatus(event, 201)
  return loadProjectDetail(projectId)
})
