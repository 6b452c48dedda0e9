import { ConnectionError } from 'sequelize'

// Errors that mean "the database is not answering" (stopped, restarting, pool exhausted), as
// opposed to a bug in a query. They may arrive bare (the mariadb driver), wrapped by Sequelize
// (`parent`/`original`) or wrapped again by h3 (`cause`), so the whole chain is looked at.

const connectionCodes = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH',
  'ER_GET_CONNECTION_TIMEOUT', 'ER_CONNECTION_TIMEOUT', 'ER_SOCKET_UNEXPECTED_CLOSE', 'ER_CONNECTION_ALREADY_CLOSED',
  'ER_CMD_CONNECTION_CLOSED', 'ER_POOL_ALREADY_CLOSED', 'ER_SERVER_SHUTDOWN', 'ER_CONNECTION_KILLED', 'ER_CON_COUNT_ERROR',
  'PROTOCOL_CONNECTION_LOST',
])

interface ErrorLike { code?: unknown; sqlState?: unknown; cause?: unknown; parent?: unknown; original?: unknown }

export const databaseDownMessage = 'The database is not answering; try again shortly (rows recorded on this device are kept and sent again).'
/** Seconds a client is asked to wait before trying again. */
export const databaseRetryAfterSeconds = 5

export function isDatabaseUnavailable(error: unknown): boolean {
  const seen = new Set<unknown>()
  for (const queue = [error]; queue.length;) {
    const e = queue.shift()
    if (!e || typeof e !== 'object' || seen.has(e)) continue
    seen.add(e)
    if (e instanceof ConnectionError) return true
    const { code, sqlState, cause, parent, original } = e as ErrorLike
    if (typeof code === 'string' && connectionCodes.has(code)) return true
    // SQLSTATE class 08 is "connection exception".
    if (typeof sqlState === 'string' && sqlState.startsWith('08')) return true
    queue.push(cause, parent, original)
  }
  return false
}
