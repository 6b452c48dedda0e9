import type { Transaction } from 'sequelize'
import { Membership, Studio, User } from '../db/models'
import type { StudioSummary } from '#shared/types/studio'
import { nameWithSuffix } from '#shared/text/nameWithSuffix'

/** A new person with their personal studio, which they own. */
export async function createAccount(input: { email: string; name: string; password: string; confirmed?: boolean }, transaction: Transaction) {
  const user = await User.create({
    email: input.email, name: input.name, passwordHash: await hashPassword(input.password),
    emailConfirmedAt: input.confirmed ? new Date() : null,
  }, { transaction })
  // A long name is cut inside the studio's name, never refused: the studio column is as long as the name's.
  const studio = await Studio.create({ name: nameWithSuffix(input.name, '’s studio'), personal: true }, { transaction })
  await Membership.create({ studioId: studio.id, userId: user.id, role: 'owner' }, { transaction })
  return user
}

export function sessionUser(user: User) {
  return { id: user.id, email: user.email, name: user.name }
}

export async function studiosOf(userId: number): Promise<StudioSummary[]> {
  const rows = await Membership.findAll({ where: { userId }, include: [Studio], order: [['studioId', 'ASC']] })
  return rows.map((m) => {
    const studio = (m as Membership & { Studio: Studio }).Studio
    return { id: studio.id, name: studio.name, role: m.role, personal: studio.personal }
  })
}
