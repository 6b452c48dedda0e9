import { mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { databaseExists, dumpDatabase, restoreDatabase } from '../../scripts/lib/backup.mjs'
import { privateMariadb } from '../../scripts/lib/mariadb.mjs'
import { root } from '../support/appServer'
import { closeTestDb, makeProject, makeStudio, testDb } from '../support/db'

// A dump of the test database restored into a fresh one holds every row of every table.

const server = privateMariadb(root)
const source = new URL(process.env.DATABASE_URL ?? '').pathname.slice(1)
const copy = `${source}_restored`
afterAll(async () => {
  await testDb().query(`DROP DATABASE IF EXISTS \`${copy}\``)
  await closeTestDb()
})

interface TableFigures { rows: number; checksum: number | null }

/** Row count and CHECKSUM TABLE of every base table. */
async function figures(database: string): Promise<Record<string, TableFigures>> {
  const db = testDb()
  const tables = await db.query<{ name: string }>(
    `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = :database AND table_type = 'BASE TABLE' ORDER BY table_name`,
    { replacements: { database }, type: QueryTypes.SELECT },
  )
  const result: Record<string, TableFigures> = {}
  for (const { name } of tables) {
    const [count] = await db.query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${database}\`.\`${name}\``, { type: QueryTypes.SELECT })
    const [sum] = await db.query<{ Checksum: number | null }>(`CHECKSUM TABLE \`${database}\`.\`${name}\``, { type: QueryTypes.SELECT })
    result[name] = { rows: Number(count!.n), checksum: sum!.Checksum === null ? null : Number(sum!.Checksum) }
  }
  return result
}

describe('backup and restore', () => {
  it('restores every row of every table into a fresh database', async () => {
    // Rows in the tables that matter most, so the comparison is not between empty tables.
    const s = await makeStudio()
    await makeProject({ studioId: s.studio.id, knitterId: s.knitter.id })

    // Other test files write meanwhile: hold every write while the figures are taken and the
    // dump's snapshot is opened, so both describe the same moment.
    const file = join(mkdtempSync(join(tmpdir(), 'floatwise-backup-')), 'dump.sql')
    const db = testDb()
    const tables = Object.keys(await figures(source))
    const seen = await db.transaction(async (transaction) => {
      // A READ lock on every table (the app user has no global FLUSH … WITH READ LOCK): other
      // sessions, the dump's among them, still read.
      await db.query(`LOCK TABLES ${tables.map(t => `\`${t}\` READ`).join(', ')}`, { transaction })
      try {
        const taken = await figures(source)
        dumpDatabase(server, source, file)
        return taken
      }
      finally {
        await db.query('UNLOCK TABLES', { transaction })
      }
    })
    expect(seen.row_events).toBeDefined()
    expect(seen.pieces!.rows).toBeGreaterThan(0)

    restoreDatabase(server, file, copy, { replace: true })
    expect(await figures(copy)).toEqual(seen)
    // A restore never lands on an existing database unless asked to.
    expect(() => restoreDatabase(server, file, copy)).toThrow(/exists/)
    expect(databaseExists(server, copy)).toBe(true)
  })
})
