import { Op } from 'sequelize'
import { confirmAddressBody } from '#shared/validation/auth'
import { EmailConfirmation, User } from '../../db/models'

// Opening the mailed link confirms the address. Whoever made the account may not be the
// person who reads this address's mail, so every other session of the account ends.
export default defineEventHandler(async (event) => {
  const { token } = await readValid(event, confirmAddressBody)
  const keep = await currentSid(event)
  const email = await useDb().transaction(async (transaction) => {
    const confirmation = await EmailConfirmation.findOne({
      where: { tokenHash: hashLinkToken(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
      lock: transaction.LOCK.UPDATE,
      transaction,
    })
    if (!confirmation)
      throw createError({ statusCode: 400, message: 'token: this link has expired or was already used; sign in and ask for a new one on your account page' })
    const user = (await User.findByPk(confirmation.userId, { transaction, lock: transaction.LOCK.UPDATE }))!
    await user.update({ emailConfirmedAt: user.emailConfirmedAt ?? new Date() }, { transaction })
    await EmailConfirmation.update({ usedAt: new Date() }, { where: { userId: user.id, usedAt: null }, transaction })
    await endSessions({ userId: user.id, except: keep }, 'address confirmed', transaction)
    return user.email
  })
  return { message: `${email} is confirmed.` }
})
