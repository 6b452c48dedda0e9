import type { H3Event } from 'h3'
import { Op } from 'sequelize'
import { SignInFailure } from '../db/models'

// Failed sign-ins allowed inside the window before a 429, per account and per address.
const windowMs = 15 * 60_000
const perAccount = 5
const perAddress = 20

export function clientAddress(event: H3Event) {
  // X-Forwarded-For is believed only behind a proxy we run (NUXT_TRUST_PROXY=true): anyone can send it.
  return getRequestIP(event, { xForwardedFor: String(useRuntimeConfig().trustProxy) === 'true' }) ?? 'unknown'
}

/** Throws 429 with Retry-After when either the account or the address has failed too often. */
export async function assertSignInAllowed(event: H3Event, email: string) {
  const since = new Date(Date.now() - windowMs)
  const address = clientAddress(event)
  for (const [where, limit] of [[{ email }, perAccount], [{ address }, perAddress]] as const) {
    const recent = await SignInFailure.findAll({
      where: { ...where, at: { [Op.gt]: since } },
      order: [['at', 'DESC']],
      limit,
      attributes: ['at'],
    })
    if (recent.length >= limit) {
      const oldest = recent[recent.length - 1]!.at.getTime()
      const retryAfter = Math.max(1, Math.ceil((oldest + windowMs - Date.now()) / 1000))
      setResponseHeader(event, 'Retry-After', retryAfter)
      throw createError({ statusCode: 429, message: `Too many sign-in attempts. Try again in ${Math.ceil(retryAfter / 60)} minute(s).` })
    }
  }
}

export async function recordSignInFailure(event: H3Event, email: string) {
  await SignInFailure.create({ email, address: clientAddress(event), at: new Date() })
}

export async function clearSignInFailures(email: string) {
  await SignInFailure.destroy({ where: { email } })
}
