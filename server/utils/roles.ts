import type { H3Event } from 'h3'
import { Membership } from '../db/models'
import { roleAtLeast, type StudioRole } from '#shared/types/studio'

/** The signed-in person, or a 401. */
export async function requireUser(event: H3Event) {
  const { user } = await requireUserSession(event, { message: 'Sign in first' })
  return user
}

export interface MemberCheck {
  /** What the 404 names: "Motif not found" (default "Studio"). */
  what?: string
  /** Whether a member with this role may see the row at all (a knitter and a draft): if not, the same 404. */
  sees?: (role: StudioRole, user: Awaited<ReturnType<typeof requireUser>>) => boolean
}

/**
 * The one access rule: the caller's role in a studio, at least `least`.
 * Not a member → 404 (a studio you are not in, and every row of it, does not exist for you;
 * `studioId` undefined is a row that does not exist, and answers the same); a member the row
 * is hidden from (`sees`) → the same 404; a lower role → 403 naming the role needed.
 */
export async function studioMember(event: H3Event, studioId: number | undefined, least: StudioRole = 'knitter', check: MemberCheck = {}) {
  const user = await requireUser(event)
  const role = studioId === undefined
    ? undefined
    : (await Membership.findOne({ where: { studioId, userId: user.id }, attributes: ['role'] }))?.role
  if (!role || (check.sees && !check.sees(role, user))) {
    throw createError({ statusCode: 404, message: `${check.what ?? 'Studio'} not found` })
  }
  if (!roleAtLeast(role, least)) throw createError({ statusCode: 403, message: `This needs the ${least} role in this studio` })
  return { user, role }
}
