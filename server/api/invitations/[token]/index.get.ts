import { Op } from 'sequelize'
import { tokenParams } from '#shared/validation/invitations'
import { Invitation, Studio, User } from '../../../db/models'

// Anyone holding the link may read what it offers; the token itself is the secret.
export default defineEventHandler(async (event) => {
  const { token } = paramsValid(event, tokenParams)
  const invitation = await Invitation.findOne({
    where: { tokenHash: hashLinkToken(token), acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    include: [Studio],
  })
  if (!invitation) throw createError({ statusCode: 404, message: 'This invitation has expired or was already used' })
  const hasAccount = (await User.count({ where: { email: invitation.email } })) > 0
  const studio = (invitation as Invitation & { Studio: Studio }).Studio
  return { studioName: studio.name, role: invitation.role, email: invitation.email, hasAccount }
})
