import { Op } from 'sequelize'
import { SignInFailure } from '../db/models'
import { signInRules } from './signInRules'

/**
 * The address value of the sign_in_failures row that records a warning mail (its `at` is when it
 * went out). No client has it: clientAddress returns an IP address or 'unknown'. Kept in the
 * table rather than in memory so "once an hour" holds across servers and restarts.
 */
export const warnedMarker = 'warned'

function plural(n: number, one: string, many: string) {
  return `${n} ${n === 1 ? one : many}`
}

/**
 * After a failed sign-in to an account that exists: once it has failed `after` times within the
 * hour, tell its owner, at most once an hour. The marker is written before it is checked, like a
 * sign-in claim, so two failures at once cannot both send the mail (at worst neither does, and
 * the next failure tries again). Errors are logged, never the sign-in's answer.
 */
export async function warnOfFailedSignIns(email: string) {
  try {
    const { windowMs, after } = signInRules.warning
    const since = new Date(Date.now() - windowMs)
    const inWindow = { email, at: { [Op.gt]: since } }
    const failures = await SignInFailure.findAll({ where: { ...inWindow, address: { [Op.ne]: warnedMarker } }, attributes: ['address'] })
    if (failures.length < after) return
    if (await SignInFailure.count({ where: { ...inWindow, address: warnedMarker } }) > 0) return
    const marker = await SignInFailure.create({ email, address: warnedMarker, at: new Date() })
    if (await SignInFailure.count({ where: { ...inWindow, address: warnedMarker } }) > 1) {
      await marker.destroy()
      return
    }
    const addresses = new Set(failures.map(f => f.address)).size
    try {
      await queueMail(null, {
        kind: 'sign-in-warning',
        to: email,
        subject: 'Failed sign-ins to your Floatwise account',
        text: [
          `Someone tried to sign in to your Floatwise account with a wrong password ${plural(failures.length, 'time', 'times')} in the last hour, from ${plural(addresses, 'network address', 'network addresses')}.`,
          '',
          'Your password still holds: none of these attempts got in, and each further try from those addresses has to wait longer. If it was you, there is nothing to do.',
          '',
          'If it was not you and the password is one you also use elsewhere, set a new one here:',
          appLink('/forgot-password'),
          '',
          'We send this mail at most once an hour.',
        ].join('\n'),
      })
    }
    catch (error) {
      await marker.destroy() // not queued, so the next failure may try again
      throw error
    }
  }
  catch (error) {
    console.error('Could not send the failed sign-in warning', error)
  }
}
