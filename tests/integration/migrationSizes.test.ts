import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Sequelize } from 'sequelize'
import { createSequelize } from '../../server/db/connection'
import { createMigrator } from '../../server/db/migrator'
import { parsedJson } from '../../server/db/models/json'
import { privateMariadb } from '../../scripts/lib/mariadb.mjs'
import { root } from '../support/appServer'

// Migration 0008 on a scratch database holding a plan and a project as they were stored
// before it: the plan becomes one size with rectangle pieces, the project is not touched.

const base = new URL(process.env.DATABASE_URL ?? '')
const name = `${base.pathname.slice(1)}_migration`
let db: Sequelize

const q = async (sql: string, replacements: unknown[] = []) => (await db.query(sql, { replacements }))[0] as Record<string, unknown>[]
const now = '2026-11-30 10:00:00.000'
const sections = [{ kind: 'plain', label: 'Welt', rows: 30, yarn: 'A' }, { kind: 'shaping', change: 'increase', stitchesEachSide: 4, rows: 40 }]
const timeline = {
  technique: 'together', passesPerColour: 1, needles: 120,
  sections: [{ kind: 'plain', label: 'Welt', rows: 30, yarn: 'A' }],
  yarns: [{ slot: 'A', name: 'Cream', hex: '#f0ead8', symbol: '●' }],
}

beforeAll(async () => {
  // A fresh database of its own on the private server, the test's user granted on it.
  const url = privateMariadb(root).ensureDatabase(name, decodeURIComponent(base.username), decodeURIComponent(base.password), { fresh: true })
  db = createSequelize(url)
  await createMigrator(db).up({ to: '0007-edit-versions' })
  await q(`INSERT INTO users (email, name, password_hash, created_at, updated_at) VALUES ('m@example.test', 'M', 'x', ?, ?)`, [now, now])
  await q(`INSERT INTO studios (name, created_at, updated_at) VALUES ('Old studio', ?, ?)`, [now, now])
  await q(`INSERT INTO plans (studio_id, name, yarns, notes, created_at, updated_at) VALUES (1, 'Old plan', '[]', '', ?, ?)`, [now, now])
  await q(`INSERT INTO plan_pieces (plan_id, name, position, target_width, target_length, unit, sections, created_at, updated_at)
    VALUES (1, 'Sleeve', 1, 20, 45, 'cm', ?, ?, ?)`, [JSON.stringify(sections), now, now])
  await q(`INSERT INTO projects (studio_id, knitter_id, name, plan_snapshot, yarns, notes, created_at, updated_at) VALUES (1, 1, 'On the needles', '{}', '[]', '', ?, ?)`, [now, now])
  await q(`INSERT INTO pieces (project_id, name, position, timeline, total_rows, completed_rows, created_at, updated_at) VALUES (1, 'Back', 1, ?, 30, 12, ?, ?)`, [JSON.stringify(timeline), now, now])
}, 60_000)

afterAll(async () => {
  await db?.query(`DROP DATABASE IF EXISTS \`${name}\``)
  await db?.close()
})

describe('migration 0008-sizes-and-shapes', () => {
  it('makes a stored plan one size with its pieces still rectangles, and leaves projects as they were', async () => {
    const piecesBefore = await q('SELECT * FROM pieces')
    await createMigrator(db).up({ to: '0008-sizes-and-shapes' })
    const [plan] = await q('SELECT sizes FROM plans')
    expect(parsedJson(plan!.sizes)).toEqual(['One size'])
    const [piece] = await q('SELECT shape, sections FROM plan_pieces')
    expect(piece!.shape).toBeNull()
    expect(parsedJson(piece!.sections)).toEqual(sections)
    expect(await q('SELECT * FROM pieces')).toEqual(piecesBefore)
    // A plan made afterwards without sizes cannot be stored without them (the column is NOT NULL).
    await expect(q(`INSERT INTO plans (studio_id, name, yarns, sizes, notes, created_at, updated_at) VALUES (1, 'New', '[]', NULL, '', ?, ?)`, [now, now])).rejects.toThrow()
  })

  it('goes down and up again', async () => {
    await createMigrator(db).down({ to: '0008-sizes-and-shapes' })
    expect((await q(`SHOW COLUMNS FROM plans LIKE 'sizes'`)).length).toBe(0)
    await createMigrator(db).up()
    expect((await q(`SHOW COLUMNS FROM plan_pieces LIKE 'shape'`)).length).toBe(1)
  })
})
