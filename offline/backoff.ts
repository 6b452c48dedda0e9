export const backoffBaseMs = 1000
export const backoffCapMs = 60_000

/**
 * Wait before retry number `failures` (1 s, 2 s, 4 s, … up to 60 s). Half the wait is random
 * ("equal jitter") so tablets that lost the same Wi-Fi do not all come back in the same second,
 * yet a retry never collapses to zero.
 */
/**
 * A server's Retry-After (seconds, or an HTTP date) in milliseconds from `now`, capped at the
 * longest backoff; null when absent or unreadable (RFC 9110 §10.2.3).
 */
export function retryAfterMs(header: string | null, now = Date.now()): number | null {
  if (!header) return null
  const value = header.trim()
  const ms = /^\d+$/.test(value) ? Number(value) * 1000 : Date.parse(value) - now
  return Number.isFinite(ms) ? Math.min(backoffCapMs, Math.max(0, ms)) : null
}

export function backoffDelay(failures: number, random: () => number = Math.random): number {
  if (failures <= 0) return 0
  const ceiling = Math.min(backoffCapMs, backoffBaseMs * 2 ** Math.min(failures - 1, 30))
  return Math.round(ceiling / 2 + random() * (ceiling / 2))
}
