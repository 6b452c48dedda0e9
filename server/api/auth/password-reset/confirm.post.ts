import { Op } from 'sequelize'
import { resetConfirmBody } from '../../../../shared/validation/auth'
import { PasswordReset, User } from '../../../db/models'

export default defineEventHandler(async (event) => {
  const body = await readValid(event, resetConfirmBody)
  const passwordHash = await hashPassword(body.password)
  await useDb().transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({
      where: { tokenHash: hashLinkToken(body.token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
      lock: transaction.LOCK.UPDATE,
      transaction,
    })
    if (!reset) throw createError({ statusCode: 400, message: 'token: this link has expired or was already used; ask for a new one' })
    await User.update({ passwordHash }, { where: { id: reset.userId }, transaction })
    // Every outstanding link for this account stops working, not just this one.
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: reset.userId, usedAt: null }, transaction })
  })
  return { message: 'Password changed: sign in with the new one.' }
})
