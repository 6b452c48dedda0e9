import { isIP } from 'node:net'

/**
 * Whether this server answers for a host name (lower case, as `URL.hostname` gives it).
 * DNS rebinding points a name of the attacker's at our address so that the browser treats
 * our answers as the attacker's page's own: every name we do not know is refused.
 *
 * Ours: the app URL's host (NUXT_APP_URL), `localhost`, any address typed as an IP (a
 * tablet on the workroom's network reaching http://192.168.1.20:3000; no name, so nothing
 * to rebind), and the names listed in NUXT_ALLOWED_HOSTS (comma-separated, e.g. a LAN name
 * like `knitroom.local`). Ports are not compared: rebinding is about the name.
 */
export function isOwnHostname(hostname: string) {
  if (isIP(hostname.replace(/^\[(.*)\]$/, '$1'))) return true
  if (hostname === 'localhost') return true
  const config = useRuntimeConfig()
  if (hostname === new URL(config.appUrl).hostname) return true
  return String(config.allowedHosts ?? '').split(',').some(name => name.trim().toLowerCase() === hostname)
}
