import { studioRef } from '#shared/validation/common'
import { newProjectBody } from '#shared/validation/projects'

// The small "new project" form. Any member may start one; the creator knits it.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  // The studio is checked before the rest of the form, so a stranger learns nothing from errors.
  const { studioId } = await readValid(event, studioRef)
  const { role } = await studioMember(event, studioId, 'knitter')
  const body = await readValid(event, newProjectBody)
  const id = await createProjectFromForm(body, user.id, role)
  setResponseStatus(event, 201)
  return loadProjectDetail(id)
})
