import type { TLSSocket } from 'node:tls'
import type { H3Event } from 'h3'

// A Host as browsers send it: a name or IPv4 address, or an IPv6 address in brackets, and
// an optional port. Anything else (spaces, paths, user names) is not a host at all.
const hostPattern = /^(?:[a-z0-9_.-]+|\[[0-9a-f:.]+\])(?::\d{1,5})?$/i

/** Forwarded headers are believed only behind a proxy we run (NUXT_TRUST_PROXY=true): anyone can send them. */
export function trustsProxy() {
  return String(useRuntimeConfig().trustProxy) === 'true'
}

function firstForwarded(event: H3Event, name: string) {
  return getRequestHeader(event, name)?.split(',')[0]!.trim() || undefined
}

/**
 * The scheme, host and port the browser sent this request to (a URL, e.g. `origin`,
 * `hostname`), or undefined when its Host names no host. Behind our proxy the forwarded
 * name and scheme are the browser's; without one they are ignored.
 */
export function requestOrigin(event: H3Event): URL | undefined {
  const trust = trustsProxy()
  const host = (trust && firstForwarded(event, 'x-forwarded-host')) || getRequestHeader(event, 'host')
  if (!host || !hostPattern.test(host)) return undefined
  const forwardedProto = trust ? firstForwarded(event, 'x-forwarded-proto')?.toLowerCase() : undefined
  const encrypted = (event.node.req.socket as TLSSocket | undefined)?.encrypted === true
  const protocol = forwardedProto === 'https' || forwardedProto === 'http' ? forwardedProto : encrypted ? 'https' : 'http'
  try {
    return new URL(`${protocol}://${host}`)
  }
  catch {
    return undefined // e.g. a port over 65535
  }
}

/**
 * Whether an Origin header is this app's own: the configured app URL (NUXT_APP_URL), or
 * exactly the scheme, host and port this request was sent to. `null` (a sandboxed frame, a
 * page opened from a file, a redirect from elsewhere) is never ours.
 */
export function isOwnOrigin(event: H3Event, origin: string) {
  let parsed: URL
  try { parsed = new URL(origin) }
  catch { return false }
  if (parsed.origin === 'null') return false
  return parsed.origin === new URL(useRuntimeConfig().appUrl).origin || parsed.origin === requestOrigin(event)?.origin
}
