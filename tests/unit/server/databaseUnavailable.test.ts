import * as mariadb from 'mariadb'
import { createError } from 'h3'
import { DatabaseError, Sequelize, UniqueConstraintError, ValidationError } from 'sequelize'
import { describe, expect, it } from 'vitest'
import { isDatabaseUnavailable } from '../../../server/db/unavailable'
import { freePort } from '../../support/appServer'

// Real errors from the driver and from Sequelize, made by talking to a port nothing listens on
// (a free port, closed again).
const closedPort = freePort

const failureOf = async (p: Promise<unknown>) => p.then(() => { throw new Error('expected a failure') }, (e: unknown) => e)
// h3 wraps whatever a handler throws: the original error becomes the `cause`.
const asH3 = (e: unknown) => createError(e as Error)

describe('isDatabaseUnavailable', () => {
  it('a refused connection from the mariadb driver (ECONNREFUSED), bare and wrapped by h3', async () => {
    const port = await closedPort()
    const error = await failureOf(mariadb.createConnection({ host: '127.0.0.1', port, user: 'x', connectTimeout: 1000 }))
    expect(isDatabaseUnavailable(error)).toBe(true)
    expect(isDatabaseUnavailable(asH3(error))).toBe(true)
  })

  it('a pool that cannot hand out a connection (ER_GET_CONNECTION_TIMEOUT)', async () => {
    const port = await closedPort()
    const pool = mariadb.createPool({ host: '127.0.0.1', port, user: 'x', acquireTimeout: 300, connectTimeout: 200, initializationTimeout: 100 })
    const error = await failureOf(pool.getConnection())
    await pool.end()
    expect((error as { code?: string }).code).toBe('ER_GET_CONNECTION_TIMEOUT')
    expect(isDatabaseUnavailable(asH3(error))).toBe(true)
  })

  it('Sequelize\'s connection errors (ConnectionRefusedError and its kin)', async () => {
    const port = await closedPort()
    const sequelize = new Sequelize(`mariadb://x:y@127.0.0.1:${port}/none`, { dialectModule: mariadb, logging: false, pool: { max: 1, acquire: 1000 } })
    const error = await failureOf(sequelize.query('SELECT 1'))
    await sequelize.close()
    expect((error as Error).name).toMatch(/^Sequelize\w*Connection\w*Error$/)
    expect(isDatabaseUnavailable(asH3(error))).toBe(true)
  })

  it('a connection lost in the middle of a query (SQLSTATE class 08 under a DatabaseError)', () => {
    const lost = Object.assign(new Error('socket has unexpectedly been closed'), { code: 'ER_SOCKET_UNEXPECTED_CLOSE', sqlState: '08S01', errno: 45009 })
    expect(isDatabaseUnavailable(asH3(new DatabaseError(lost as never)))).toBe(true)
    const shutdown = Object.assign(new Error('Server shutdown in progress'), { sqlState: '08S01', errno: 1053 })
    expect(isDatabaseUnavailable(new DatabaseError(shutdown as never))).toBe(true)
  })

  it.each([
    ['a 404 the route meant', createError({ statusCode: 404, message: 'Project not found' })],
    ['a duplicate key', new UniqueConstraintError({ message: 'Validation error' })],
    ['a validation error', new ValidationError('bad', [])],
    [
      'a syntax error in a query',
      new DatabaseError(Object.assign(new Error('You have an error in your SQL syntax'), { code: 'ER_PARSE_ERROR', sqlState: '42000' }) as never),
    ],
    ['a plain bug', new TypeError('Cannot read properties of undefined')],
    ['nothing at all', undefined],
  ])('%s is not the database being down', (_, error) => {
    expect(isDatabaseUnavailable(error)).toBe(false)
    expect(isDatabaseUnavailable(asH3(error ?? new Error('x')))).toBe(false)
  })

  it('an error whose causes loop back on themselves ends', () => {
    const a: Error & { cause?: unknown } = new Error('a')
    const b: Error & { cause?: unknown } = new Error('b', { cause: a })
    a.cause = b
    expect(isDatabaseUnavailable(a)).toBe(false)
  })
})
