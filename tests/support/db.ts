import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Sequelize } from 'sequelize'
import { createSequelize } from '../../server/db/connection'
import { initModels, Membership, Studio, User } from '../../server/db/models'
import type { StudioRole } from '../../shared/types/studio'
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
  return User.create({ email: uniqueEmail(tag), name: `Test ${tag}`, passwordHash: await fixtureHash })
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
