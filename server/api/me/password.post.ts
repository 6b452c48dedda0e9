import { passwordChangeBody } from '#shared/validation/me'
import { User } from '../../db/models'

// A new password for the signed-in person; every other device they were signed in on must
// sign in again. Wrong current passwords count towards the sign-in throttle like a sign-in.
export default defineEventHandler(async (event) => {
  const { id, email } = await requireUser(event)
  const body = await readValid(event, passwordChangeBody)
  await claimSignInAttempt(event, email)
  const user = (await User.findByPk(id))!
  if (!(await verifyPassword(user.passwordHash, body.current))) {
    throw createError({
      statusCode: 400,
      message: 'current: this is not your current password',
      data: { issues: [{ path: ['current'], message: 'is not your current password' }] },
    })
  }
  await clearSignInFailures(event, email)
  await user.update({ passwordHash: await hashPassword(body.password) })
  const ended = await endSessions({ userId: id, except: await currentSid(event) }, 'password changed')
  return { message: ended ? `Password changed; ${ended} other ${ended === 1 ? 'device was' : 'devices were'} signed out.` : 'Password changed.' }
})
