import { Op } from 'sequelize'
import { studioRef } from '#shared/validation/common'
import { Invitation, Membership, User } from '../../../../db/models'

// Members of a studio for any member; their e-mail addresses and the pending invitations only
// for owners (who invite and remove people), names and roles for everyone else.
export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { studioId } = paramsValid(event, studioRef)
  const { role } = await studioMember(event, studioId)
  const owner = role === 'owner'
  const rows = await Membership.findAll({ where: { studioId }, include: [{ model: User, attributes: ['id', 'name', 'email'] }], order: [['createdAt', 'ASC']] })
  const members = rows.map((m) => {
    const u = (m as Membership & { User: User }).User
    return { userId: u.id, name: u.name, ...(owner ? { email: u.email } : {}), role: m.role, since: m.createdAt }
  })
  const invitations = owner
    ? (await Invitation.findAll({ where: { studioId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } }, order: [['createdAt', 'DESC']] }))
        .map(i => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt }))
    : []
  return { members, invitations }
})
