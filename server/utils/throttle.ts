import { isIP } from 'node:net'
import type { H3Event } from 'h3'
import { Op } from 'sequelize'
import { SignInFailure } from '../db/models'
import { failuresToCap, growingDelayWaitMs, hardLimitWaitMs, signInRules, tryAgainIn } from './signInRules'
import { warnedMarker } from './signInWarning'

// The widest address an address column holds (sign_in_failures.address is VARCHAR(64)).
const addressColumnLength = 64

export function clientAddress(event: H3Event) {
  // X-Forwarded-For is believed only behind a proxy we run (NUXT_TRUST_PROXY=true), and only its
  // last entry, the one that proxy added: anything before it is whatever the client sent.
  if (trustsProxy()) {
    const forwarded = getRequestHeader(event, 'x-forwarded-for')?.split(',').pop()?.trim()
    if (forwarded && isIP(forwarded) && forwarded.length <= addressColumnLength) return forwarded
  }
  return getRequestIP(event) ?? 'unknown'
}

/** The failures one rule counts, newest first, at most `limit`. */
function recentFailures(where: object, windowMs: number, limit: number, now: number) {
  return SignInFailure.findAll({
    where: { ...where, at: { [Op.gt]: new Date(now - windowMs) } },
    order: [['at', 'DESC'], ['id', 'DESC']],
    limit,
    attributes: ['id', 'at'],
  })
}

/**
 * Claims one sign-in attempt, or throws 429 with Retry-After while a rule of signInRules says
 * wait. The attempt is written before anything is counted, so each of a burst of parallel
 * requests sees the ones before it (the n-th sees at least n - 1 others, which makes it wait);
 * counting rows written after ours only makes us wait more. The row stays as the failure unless
 * clearSignInFailures follows.
 */
export async function claimSignInAttempt(event: H3Event, email: string) {
  const address = clientAddress(event)
  const claim = await SignInFailure.create({ email, address, at: new Date() })
  const now = Date.now()
  const others = (rows: SignInFailure[]) => rows.filter(r => r.id !== claim.id).map(r => r.at)
  const { pair, address: perAddress, account } = signInRules
  const [fromPair, fromAddress, forAccount] = await Promise.all([
    recentFailures({ email, address }, pair.windowMs, failuresToCap(pair) + 1, now),
    recentFailures({ address }, perAddress.windowMs, perAddress.limit + 1, now),
    recentFailures({ email, address: { [Op.ne]: warnedMarker } }, account.windowMs, failuresToCap(account) + 1, now),
  ])
  const waits = [
    { ms: growingDelayWaitMs(others(fromPair), pair, now), why: 'from this address' },
    { ms: hardLimitWaitMs(fromAddress.map(r => r.at), perAddress, now), why: 'from this address' },
    { ms: growingDelayWaitMs(others(forAccount), account, now), why: 'for this account' },
  ]
  const longest = waits.reduce((a, b) => (b.ms > a.ms ? b : a))
  if (longest.ms > 0) {
    await claim.destroy() // a refused attempt is not a failure: hammering does not extend the wait
    const retryAfter = Math.max(1, Math.ceil(longest.ms / 1000))
    setResponseHeader(event, 'Retry-After', retryAfter)
    throw createError({ statusCode: 429, message: `Too many failed sign-ins ${longest.why}. ${tryAgainIn(retryAfter)}` })
  }
}

/** After the right password: that address starts afresh; the account's failures from elsewhere stay counted. */
export async function clearSignInFailures(event: H3Event, email: string) {
  await SignInFailure.destroy({ where: { email, address: clientAddress(event) } })
}
