// What failed sign-ins cost. Three counts over sign_in_failures, each with its own rule:
// - one address against one account (an attacker, or the owner mistyping): a few free tries,
//   then a wait that doubles with each failure, up to 15 minutes;
// - one address against every account: a hard limit, since only an attacker fails that often;
// - one account from every address: slowed only under a wide attack and by 30 s at most, so
//   failures from elsewhere can slow the owner down but never lock them out.
// Pure: the queries are in throttle.ts, so these numbers can be tested on their own.

const second = 1000
const minute = 60 * second
const hour = 60 * minute

/** Free failures, then a wait after each further one that doubles from `firstMs` up to `capMs`. */
export interface GrowingDelayRule { windowMs: number; free: number; firstMs: number; capMs: number }
/** No more than `limit` failures within the window. */
export interface HardLimitRule { windowMs: number; limit: number }

export const signInRules = {
  // A day, so the waits can climb to the cap (1 + 2 + … + 512 s is longer than the cap) and stay there.
  pair: { windowMs: 24 * hour, free: 3, firstMs: second, capMs: 15 * minute } satisfies GrowingDelayRule,
  address: { windowMs: 15 * minute, limit: 20 } satisfies HardLimitRule,
  account: { windowMs: 15 * minute, free: 50, firstMs: second, capMs: 30 * second } satisfies GrowingDelayRule,
  // The owner hears of it once the account has failed this often within the window, at most once per window.
  warning: { windowMs: hour, after: 10 },
}

/** The wait that `failures` earlier failures impose, counted from the newest of them. */
export function growingDelayMs(failures: number, rule: GrowingDelayRule) {
  if (failures < rule.free) return 0
  return Math.min(rule.capMs, rule.firstMs * 2 ** Math.min(failures - rule.free, 40))
}

/** How many failures it takes to reach the cap: counting more changes nothing, so queries stop there. */
export function failuresToCap(rule: GrowingDelayRule) {
  return rule.free + Math.ceil(Math.log2(rule.capMs / rule.firstMs))
}

/** Milliseconds until an attempt may be considered (0: now), given the other failures' times, newest first. */
export function growingDelayWaitMs(others: Date[], rule: GrowingDelayRule, now: number) {
  const delay = growingDelayMs(others.length, rule)
  return delay === 0 ? 0 : Math.max(0, others[0]!.getTime() + delay - now)
}

/**
 * The same under a hard limit. `recent` holds the failures in the window newest first, this
 * attempt's own among them, at most `limit + 1`: over the limit, the wait lasts until the oldest
 * of them leaves the window.
 */
export function hardLimitWaitMs(recent: Date[], rule: HardLimitRule, now: number) {
  if (recent.length <= rule.limit) return 0
  return Math.max(1, recent[rule.limit]!.getTime() + rule.windowMs - now)
}

/** "Try again in 5 minutes." with seconds under a minute. */
export function tryAgainIn(seconds: number) {
  if (seconds < 60) return `Try again in ${seconds} ${seconds === 1 ? 'second' : 'seconds'}.`
  const minutes = Math.ceil(seconds / 60)
  return `Try again in ${minutes} ${minutes === 1 ? 'minute' : 'minutes'}.`
}
