import { Op } from 'sequelize'
import { resetConfirmBody } from '#shared/validation/auth'
import { PasswordReset, User } from '../../../db/models'

// The link proves the person reads the address's mail: the address counts as confirmed, and
// every session of the account ends (whoever else held one must sign in with the new password).
export default defineEventHandler(async (event) => {
  const body = await readValid(event, resetConfirmBody)
  const passwordHash = await hashPassword(body.password)
  const keep = await currentSid(event)
  await useDb().transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({
      where: { tokenHash: hashLinkToken(body.token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
      lock: transaction.LOCK.UPDATE,
      transaction,
    })
    if (!reset) throw createError({ statusCode: 400, message: 'token: this link has expired or was already used; ask for a new one' })
    const user = (await User.findByPk(reset.userId, { transaction, lock: transaction.LOCK.UPDATE }))!
    await user.update({ passwordHash, emailConfirmedAt: user.emailConfirmedAt ?? new Date() }, { transaction })
    // Every outstanding link for this account stops working, not just this one.
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: reset.userId, usedAt: null }, transaction })
    await endSessions({ userId: reset.userId, except: keep }, 'password reset', transaction)
  })
  return { message: 'Password changed: sign in with the new one. Every device that was signed in must sign in again.' }
})
