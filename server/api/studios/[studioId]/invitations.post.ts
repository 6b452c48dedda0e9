import { studioRef } from '#shared/validation/common'
import { inviteBody } from '#shared/validation/studios'

export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { studioId } = paramsValid(event, studioRef)
  const { user } = await studioMember(event, studioId, 'owner')
  const body = await readValid(event, inviteBody)
  const invitation = await inviteToStudio(event, { studioId, email: body.email, role: body.role, invitedBy: user })
  setResponseStatus(event, 201)
  return { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt }
})
