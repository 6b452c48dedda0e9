import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Sequelize } from 'sequelize'
import { createSequelize } from '../../server/db/connection'
import { initModels, Membership, Motif, Piece, Studio, User, Yarn } from '../../server/db/models'
import { insertProject } from '../../server/db/projects'
import { motifRecord } from '../../server/db/motifs'
import { borderedMotifTimeline, slotYarns } from '#shared/piece/timeline'
import type { StudioRole } from '#shared/types/studio'
import { uniqueEmail } from './api'

let sequelize: Sequelize | undefined

/** The test database, through the app's own models (fixtures and checks; never a mock). */
export function testDb() {
  if (!sequelize) {
    sequelize = createSequelize(process.env.DATABASE_URL ?? '')
    initModels(sequelize)
  }
  return sequelize
}

export async function closeTestDb() {
  await sequelize?.close()
  sequelize = undefined
}

export const fixturePassword = 'fixture-password-123'
let fixtureHash: Promise<string> | undefined

export async function makeUser(tag: string) {
  testDb()
  fixtureHash ??= new Hash(new Scrypt({})).make(fixturePassword)
  return User.create({ email: uniqueEmail(tag), name: `Test ${tag}`, passwordHash: await fixtureHash, emailConfirmedAt: new Date() })
}

/** A studio with one person per role, plus people for tests to change, and an outsider in another studio. */
export async function makeStudio(extraKnitters = 0) {
  testDb()
  const studio = await Studio.create({ name: `Test studio ${Math.random().toString(36).slice(2, 8)}` })
  const people: Record<StudioRole, User> = {} as Record<StudioRole, User>
  for (const role of ['owner', 'designer', 'knitter'] as const) {
    people[role] = await makeUser(role)
    await Membership.create({ studioId: studio.id, userId: people[role].id, role })
  }
  const spares: User[] = []
  for (let i = 0; i < extraKnitters; i++) {
    const u = await makeUser('spare')
    await Membership.create({ studioId: studio.id, userId: u.id, role: 'knitter' })
    spares.push(u)
  }
  const elsewhere = await Studio.create({ name: 'Another studio' })
  const outsider = await makeUser('outsider')
  await Membership.create({ studioId: elsewhere.id, userId: outsider.id, role: 'owner' })
  return { studio, ...people, spares, outsider, elsewhere }
}

/** A studio's stock for project tests: a published and a draft motif, and two yarns. */
export async function makeStock(studioId: number) {
  testDb()
  const motif = (name: string, rows: string[], published: boolean) =>
    Motif.create({ studioId, name, published, createdBy: null, updatedBy: null, ...motifRecord(rows) })
  return {
    motif: await motif('Fixture zigzag', ['x..', '.x.', '..x', '.x.'], true),
    draft: await motif('Fixture draft', ['xx..', '..xx'], false),
    main: await Yarn.create({ studioId, name: 'Fixture oat', hex: '#e8dcc0', weightCategory: 1, metresPer100g: 400 }),
    contrast: await Yarn.create({ studioId, name: 'Fixture navy', hex: '#1c2a4a', weightCategory: 1, metresPer100g: 400 }),
  }
}

/**
 * A project with pieces knitted by `knitterId`, compiled with the engine like the API's:
 * `before` plain rows, the chart for `chartRows` rows, `after` plain rows (together: 4 + 8 + 2 = 14 rows).
 */
export async function makeProject(options: {
  studioId: number
  knitterId: number
  pieces?: string[]
  name?: string
  shape?: { chart?: string[]; chartRows?: number; before?: number; after?: number }
}) {
  const db = testDb()
  const yarns = slotYarns([{ name: 'Fixture oat', hex: '#e8dcc0' }, { name: 'Fixture navy', hex: '#1c2a4a' }])
  const timeline = borderedMotifTimeline({
    technique: 'together', needles: 60, yarns,
    motif: { name: 'Fixture zigzag', chart: options.shape?.chart ?? ['x..', '.x.', '..x', '.x.'] },
    chartRows: options.shape?.chartRows ?? 8, borderBefore: options.shape?.before ?? 4, borderAfter: options.shape?.after ?? 2,
  })
  const project = await db.transaction(t => insertProject({
    studioId: options.studioId, knitterId: options.knitterId, name: options.name ?? 'Fixture project',
    yarns: yarns.map(y => ({ ...y, yarnId: null })), source: 'fixture', motifName: 'Fixture zigzag',
    pieces: (options.pieces ?? ['Back', 'Front']).map(name => ({ name, timeline })),
  }, t))
  const pieces = await Piece.findAll({ where: { projectId: project.id }, order: [['position', 'ASC']] })
  return { project, pieces }
}
