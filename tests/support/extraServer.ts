import { inject } from 'vitest'
import { startAppServer } from './appServer'

/**
 * A second built server for a test (other settings, a restart to play), on the test database and
 * sharing the project server's mail fake: both servers send from the one mail queue.
 */
export function startExtraAppServer(extraEnv: Record<string, string> = {}) {
  return startAppServer(extraEnv, { mail: { url: inject('smtpUrl'), dir: inject('mailDir') } })
}
