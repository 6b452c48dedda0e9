import { Op } from 'sequelize'
import { studioParams } from '../../../../../shared/validation/auth'
import { Invitation, Membership, User } from '../../../../db/models'

// Members of a studio for any member; pending invitations only for owners.
export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { studioId } = paramsValid(event, studioParams)
  const { membership } = await requireStudioRole(event, studioId)
  const rows = await Membership.findAll({ where: { studioId }, include: [User], order: [['createdAt', 'ASC']] })
  const members = rows.map((m) => {
    const u = (m as Membership & { User: User }).User
    return { userId: u.id, name: u.name, email: u.email, role: m.role, since: m.createdAt }
  })
  const invitations = membership.role === 'owner'
    ? (await Invitation.findAll({ where: { studioId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } }, order: [['createdAt', 'DESC']] }))
        .map(i => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt }))
    : []
  return { members, invitations }
})
