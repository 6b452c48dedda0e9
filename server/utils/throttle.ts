import type { H3Event } from 'h3'
import { Op } from 'sequelize'
import { SignInFailure } from '../db/models'

// Failed sign-ins allowed inside the window before a 429, per account and per address.
const windowMs = 15 * 60_000
const perAccount = 5
const perAddress = 20

export function clientAddress(event: H3Event) {
  return getRequestIP(event, { xForwardedFor: trustsProxy() }) ?? 'unknown'
}

/**
 * Claims one sign-in attempt, or throws 429 with Retry-After when the account or the address
 * has failed too often. The attempt is written before it is counted, so a burst of parallel
 * requests cannot all pass the count before any of them is recorded: the n-th attempt always
 * sees at least n rows. The row stays as the failure unless clearSignInFailures follows.
 */
export async function claimSignInAttempt(event: H3Event, email: string) {
  const address = clientAddress(event)
  const claim = await SignInFailure.create({ email, address, at: new Date() })
  const since = new Date(Date.now() - windowMs)
  for (const [where, limit] of [[{ email }, perAccount], [{ address }, perAddress]] as const) {
    const recent = await SignInFailure.findAll({
      where: { ...where, at: { [Op.gt]: since } },
      order: [['at', 'DESC']],
      limit: limit + 1,
      attributes: ['at'],
    })
    if (recent.length > limit) {
      await claim.destroy() // a refused attempt is not a failure: hammering does not extend the wait
      const oldest = recent[recent.length - 1]!.at.getTime()
      const retryAfter = Math.max(1, Math.ceil((oldest + windowMs - Date.now()) / 1000))
      setResponseHeader(event, 'Retry-After', retryAfter)
      throw createError({ statusCode: 429, message: `Too many sign-in attempts. Try again in ${Math.ceil(retryAfter / 60)} minute(s).` })
    }
  }
}

export async function clearSignInFailures(email: string) {
  await SignInFailure.destroy({ where: { email } })
}
