import { loginBody } from '#shared/validation/auth'
import { User } from '../../db/models'

// A stand-in hash so an unknown address costs the same time as a wrong password.
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const body = await readValid(event, loginBody)
  await claimSignInAttempt(event, body.email)
  const user = await User.findOne({ where: { email: body.email } })
  const ok = user
    ? await verifyPassword(user.passwordHash, body.password)
    : (await verifyPassword(await (decoyHash ??= hashPassword('decoy-password-for-timing')), body.password), false)
  if (!user || !ok) {
    // Not awaited, so that a known address answers no slower than an unknown one.
    if (user) event.waitUntil(warnOfFailedSignIns(body.email))
    throw createError({ statusCode: 401, message: 'E-mail or password is wrong' })
  }
  await clearSignInFailures(event, body.email)
  await startSession(event, user)
  return { user: sessionUser(user), studios: await studiosOf(user.id) }
})
