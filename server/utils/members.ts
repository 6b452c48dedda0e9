import { Membership } from '../db/models'
import type { StudioRole } from '#shared/types/studio'

/**
 * Changes run in a transaction that locks the studio's owner rows, so two owners
 * demoting each other at once cannot leave a studio with none.
 */
async function withMember<T>(studioId: number, userId: number, work: (m: Membership, owners: number, t: import('sequelize').Transaction) => Promise<T>) {
  return useDb().transaction(async (transaction) => {
    const owners = await Membership.findAll({ where: { studioId, role: 'owner' }, lock: transaction.LOCK.UPDATE, transaction })
    const member = await Membership.findOne({ where: { studioId, userId }, lock: transaction.LOCK.UPDATE, transaction })
    if (!member) throw createError({ statusCode: 404, message: 'Member not found' })
    return work(member, owners.length, transaction)
  })
}

export function changeMemberRole(studioId: number, userId: number, role: StudioRole) {
  return withMember(studioId, userId, async (member, owners, transaction) => {
    if (member.role === 'owner' && role !== 'owner' && owners <= 1) {
      throw createError({ statusCode: 409, message: 'A studio needs an owner: make someone else owner first' })
    }
    member.role = role
    await member.save({ transaction })
    return member
  })
}

export function removeMember(studioId: number, userId: number) {
  return withMember(studioId, userId, async (member, owners, transaction) => {
    if (member.role === 'owner' && owners <= 1) {
      throw createError({ statusCode: 409, message: 'The last owner cannot leave or be removed: make someone else owner first' })
    }
    await member.destroy({ transaction })
  })
}
