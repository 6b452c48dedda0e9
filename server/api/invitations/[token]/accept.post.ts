import { Op } from 'sequelize'
import { invitationAcceptBody, tokenParams } from '#shared/validation/invitations'
import { Invitation, Membership, User } from '../../../db/models'

// Single use: the invitation row is locked, checked and marked accepted in one transaction.
export default defineEventHandler(async (event) => {
  const { token } = paramsValid(event, tokenParams)
  const body = await readValid(event, invitationAcceptBody)
  const session = await getUserSession(event)
  const user = await useDb().transaction(async (transaction) => {
    const invitation = await Invitation.findOne({
      where: { tokenHash: hashLinkToken(token), acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
      lock: transaction.LOCK.UPDATE,
      transaction,
    })
    if (!invitation) throw createError({ statusCode: 404, message: 'This invitation has expired or was already used' })
    let person = await User.findOne({ where: { email: invitation.email }, transaction })
    if (person && session.user?.id !== person.id) {
      throw createError({ statusCode: 401, message: `Sign in as ${invitation.email} to accept this invitation` })
    }
    // Whoever made an unconfirmed account may not own the address the invitation went to.
    if (person) requireConfirmedAddress(person)
    if (!person) {
      if (!body.name || !body.password) {
        throw createError({ statusCode: 400, message: 'name and password: both are needed to make your account' })
      }
      // The token came by mail to this address: that confirms it.
      person = await createAccount({ email: invitation.email, name: body.name, password: body.password, confirmed: true }, transaction)
    }
    const existing = await Membership.findOne({ where: { studioId: invitation.studioId, userId: person.id }, transaction })
    if (!existing) await Membership.create({ studioId: invitation.studioId, userId: person.id, role: invitation.role }, { transaction })
    invitation.acceptedAt = new Date()
    await invitation.save({ transaction })
    return person
  })
  await startSession(event, user)
  return { user: sessionUser(user), studios: await studiosOf(user.id) }
})
