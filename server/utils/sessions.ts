import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { Op, type Transaction } from 'sequelize'
import { UserSession, type User } from '../db/models'

// Sealed cookies stay, but each carries a session id that must be live in `user_sessions`:
// ending a session (sign-out, password reset, removal by an owner, "sign out everywhere")
// takes effect on this server at once and on any other server within `cacheMs`.
const cacheMs = 3_000
// How often a live session's "last seen" is written (not on every tap).
const touchMs = 60_000

interface Known { userId: number; live: boolean; checkedAt: number; touchedAt: number }
const known = new Map<string, Known>()

// The same sha256 as mailed links' tokens (tokens.ts): only the hash is stored.
const hashSid = hashLinkToken

/** A short label of the device, from its user agent, for the account page's list. */
export function deviceLabel(userAgent: string | undefined) {
  const ua = userAgent ?? ''
  const system = [
    ['iPad', 'iPad'],
    ['iPhone', 'iPhone'],
    ['Android', 'Android'],
    ['Windows', 'Windows'],
    ['Mac OS', 'Mac'],
    ['CrOS', 'Chromebook'],
    ['Linux', 'Linux'],
  ].find(([needle]) => ua.includes(needle!))?.[1]
  const browser = [['Edg/', 'Edge'], ['Firefox/', 'Firefox'], ['Chrome/', 'Chrome'], ['Safari/', 'Safari']]
    .find(([needle]) => ua.includes(needle!))?.[1]
  return [browser, system].filter(Boolean).join(' on ') || (ua.slice(0, 60) || 'Unknown device')
}

/** Signs a person in on this device with a new session id (any earlier one here ends). */
export async function startSession(event: H3Event, user: User) {
  const before = await getUserSession(event)
  if (typeof before.sid === 'string') await endSessions({ sid: before.sid }, 'signed in again')
  const sid = randomBytes(32).toString('base64url')
  await UserSession.create({
    userId: user.id,
    sidHash: hashSid(sid),
    device: deviceLabel(getRequestHeader(event, 'user-agent')).slice(0, 120),
    address: clientAddress(event).slice(0, 64),
    lastSeenAt: new Date(),
  })
  await setUserSession(event, { user: sessionUser(user), sid, loggedInAt: Date.now() })
}

/**
 * Whether the session a cookie names is still live for that person. Cached for `cacheMs`;
 * a live one's last-seen time is written at most every `touchMs`.
 */
export async function sessionIsLive(sid: unknown, userId: number) {
  if (typeof sid !== 'string' || sid.length > 100) return false
  const now = Date.now()
  const cached = known.get(sid)
  if (cached && now - cached.checkedAt < cacheMs) return cached.live && cached.userId === userId
  const row = await UserSession.findOne({ where: { sidHash: hashSid(sid) }, attributes: ['id', 'userId', 'endedAt', 'lastSeenAt'] })
  const live = !!row && row.endedAt === null && row.userId === userId
  const touchedAt = cached?.touchedAt ?? row?.lastSeenAt.getTime() ?? 0
  known.set(sid, { userId: row?.userId ?? -1, live, checkedAt: now, touchedAt })
  if (live && now - touchedAt > touchMs) {
    known.get(sid)!.touchedAt = now
    await UserSession.update({ lastSeenAt: new Date(now) }, { where: { id: row!.id } })
  }
  if (known.size > 10_000) known.clear() // a bound, not an eviction policy: the next look is one query
  return live
}

/** Ends sessions: one (by its id), or all of a person's (optionally but one). */
export async function endSessions(
  which: { sid: string } | { userId: number; except?: string | null } | { id: number; userId: number },
  reason: string,
  transaction?: Transaction,
) {
  const where = 'sid' in which
    ? { sidHash: hashSid(which.sid) }
    : 'id' in which
      ? { id: which.id, userId: which.userId }
      : { userId: which.userId, ...(which.except ? { sidHash: { [Op.ne]: hashSid(which.except) } } : {}) }
  const [count] = await UserSession.update({ endedAt: new Date(), endReason: reason }, { where: { ...where, endedAt: null }, transaction })
  // This server forgets what it knew; other servers notice within cacheMs.
  if ('sid' in which) known.delete(which.sid)
  else for (const [sid, k] of known) if (k.userId === which.userId) known.delete(sid)
  return count
}

/** The id of this request's session (undefined when signed out). */
export async function currentSid(event: H3Event) {
  const { sid } = await getUserSession(event)
  return typeof sid === 'string' ? sid : undefined
}

export function sessionIdHash(sid: string | undefined) {
  return sid ? hashSid(sid) : undefined
}
