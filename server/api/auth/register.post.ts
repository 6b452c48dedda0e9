import { registerBody } from '#shared/validation/auth'
import { User } from '../../db/models'

// The same 201 answer whether or not the address already has an account, so the route
// cannot be used to find out who is registered; the mail (sent after the answer) tells the
// owner of the address. A new account's address is unconfirmed until its link is opened.
export default defineEventHandler(async (event) => {
  const body = await readValid(event, registerBody)
  const existing = await User.findOne({ where: { email: body.email } })
  if (existing) {
    await hashPassword(body.password) // same work as a real sign-up
    await queueMail(event, {
      kind: 'account-exists',
      to: body.email,
      subject: 'Someone tried to make a Floatwise account with your address',
      text: `You already have a Floatwise account. If you forgot its password, set a new one here:\n${appLink('/forgot-password')}\n\nIf this was not you, you can ignore this mail.`,
    })
  }
  else {
    await useDb().transaction(async (t) => {
      const user = await createAccount(body, t)
      await queueAddressConfirmation(event, user, t)
    })
  }
  setResponseStatus(event, 201)
  return { message: 'Account ready: sign in with your e-mail and password, and open the link we mailed you to confirm your address.' }
})
