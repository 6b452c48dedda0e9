import { describe, expect, it } from 'vitest'
import { failuresToCap, growingDelayMs, growingDelayWaitMs, hardLimitWaitMs, signInRules, tryAgainIn } from '../../../server/utils/signInRules'

const { pair, account, address } = signInRules
const at = (msAgo: number, now: number) => new Date(now - msAgo)

describe('growingDelayMs', () => {
  // Our own rule (issue #14): 3 free failures, then 2^(n-3) s, capped at 15 minutes.
  it.each([
    [0, 0], [2, 0], [3, 1000], [4, 2000], [5, 4000], [12, 512_000], [13, 900_000], [14, 900_000], [10_000, 900_000],
  ])('one address against one account: %i failures wait %i ms', (failures, ms) => {
    expect(growingDelayMs(failures, pair)).toBe(ms)
  })

  it.each([
    [49, 0], [50, 1000], [54, 16_000], [55, 30_000], [500, 30_000],
  ])('one account from every address: %i failures wait %i ms, never more than 30 s', (failures, ms) => {
    expect(growingDelayMs(failures, account)).toBe(ms)
  })

  it('reaches the cap exactly at failuresToCap, so counting further changes nothing', () => {
    for (const rule of [pair, account]) {
      expect(growingDelayMs(failuresToCap(rule), rule)).toBe(rule.capMs)
      expect(growingDelayMs(failuresToCap(rule) - 1, rule)).toBeLessThan(rule.capMs)
    }
  })
})

describe('waits', () => {
  const now = Date.UTC(2026, 11, 3, 12)

  it('counts the growing delay from the newest other failure', () => {
    const others = [at(1500, now), at(60_000, now), at(120_000, now), at(180_000, now)] // 4 → 2 s
    expect(growingDelayWaitMs(others, pair, now)).toBe(500)
    expect(growingDelayWaitMs(others.slice(1), pair, now)).toBe(0) // 3 → 1 s, the newest a minute ago
    expect(growingDelayWaitMs(others.slice(2), pair, now)).toBe(0) // free
  })

  it('holds the hard limit until the oldest of the newest limit + 1 leaves the window', () => {
    const recent = Array.from({ length: address.limit + 1 }, (_, i) => at(i * 1000, now))
    expect(hardLimitWaitMs(recent, address, now)).toBe(address.windowMs - address.limit * 1000)
    expect(hardLimitWaitMs(recent.slice(1), address, now)).toBe(0)
  })
})

describe('tryAgainIn', () => {
  it.each([
    [1, 'Try again in 1 second.'], [2, 'Try again in 2 seconds.'], [59, 'Try again in 59 seconds.'],
    [60, 'Try again in 1 minute.'], [61, 'Try again in 2 minutes.'], [900, 'Try again in 15 minutes.'],
  ])('%i s: %s', (seconds, sentence) => {
    expect(tryAgainIn(seconds)).toBe(sentence)
  })
})
