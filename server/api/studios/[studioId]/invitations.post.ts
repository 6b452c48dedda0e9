import { inviteBody, studioParams } from '../../../../shared/validation/auth'
import { Invitation, Studio } from '../../../db/models'

const lifetimeMs = 7 * 24 * 60 * 60_000

export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { studioId } = paramsValid(event, studioParams)
  const { user } = await requireStudioRole(event, studioId, 'owner')
  const body = await readValid(event, inviteBody)
  const studio = await Studio.findByPk(studioId)
  const { token, hash } = newLinkToken()
  const invitation = await Invitation.create({
    studioId, email: body.email, role: body.role, tokenHash: hash, invitedBy: user.id,
    expiresAt: new Date(Date.now() + lifetimeMs),
  })
  await sendMail({
    to: body.email,
    subject: `${user.name} invites you to ${studio!.name} on Floatwise`,
    text: `${user.name} invites you to join ${studio!.name} on Floatwise as ${body.role}. The link works once, for seven days:\n${appLink(`/invitations/${token}`)}`,
  })
  setResponseStatus(event, 201)
  return { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt }
})
