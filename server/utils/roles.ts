import type { H3Event } from 'h3'
import { Membership } from '../db/models'
import { roleRank, type StudioRole } from '#shared/types/studio'

/** The signed-in person, or a 401. */
export async function requireUser(event: H3Event) {
  const { user } = await requireUserSession(event, { message: 'Sign in first' })
  return user
}

/**
 * The caller's membership of a studio with at least `least` role.
 * Not a member → 404 (a studio you are not in does not exist for you);
 * a member with too low a role → 403 naming the role needed.
 */
export async function requireStudioRole(event: H3Event, studioId: number, least: StudioRole = 'knitter') {
  const user = await requireUser(event)
  const membership = await Membership.findOne({ where: { studioId, userId: user.id } })
  if (!membership) throw createError({ statusCode: 404, message: 'Studio not found' })
  if (roleRank[membership.role] < roleRank[least]) {
    throw createError({ statusCode: 403, message: `This needs the ${least} role in this studio` })
  }
  return { user, membership }
}
