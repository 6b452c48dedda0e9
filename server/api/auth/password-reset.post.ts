import { resetRequestBody } from '../../../shared/validation/auth'
import { PasswordReset, User } from '../../db/models'

const lifetimeMs = 60 * 60_000

// Always 202: the answer never says whether the address has an account.
export default defineEventHandler(async (event) => {
  const { email } = await readValid(event, resetRequestBody)
  const user = await User.findOne({ where: { email } })
  if (user) {
    const { token, hash } = newLinkToken()
    await PasswordReset.create({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + lifetimeMs) })
    await sendMail({
      to: user.email,
      subject: 'Set a new Floatwise password',
      text: `Someone asked to set a new password for your Floatwise account. The link works once, for one hour:\n${appLink(`/reset-password?token=${token}`)}\n\nIf it was not you, ignore this mail: your password stays as it is.`,
    })
  }
  setResponseStatus(event, 202)
  return { message: 'If the address has an account, a link to set a new password is on its way.' }
})
