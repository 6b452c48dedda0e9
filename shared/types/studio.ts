export const studioRoles = ['owner', 'designer', 'knitter'] as const
export type StudioRole = typeof studioRoles[number]

/** Higher rank can do everything a lower rank can (owner > designer > knitter). */
export const roleRank: Record<StudioRole, number> = { knitter: 1, designer: 2, owner: 3 }

/** Whether `role` may do what `least` may (no role: not a member, nothing). */
export function roleAtLeast(role: StudioRole | null | undefined, least: StudioRole) {
  return !!role && roleRank[role] >= roleRank[least]
}

export type Technique = 'together' | 'colour-by-colour'

export interface StudioSummary { id: number; name: string; role: StudioRole; personal: boolean }

/** `email` only in the answer to owners: other members see each other by name. */
export interface StudioMember { userId: number; name: string; email?: string; role: StudioRole; since: string }
export interface PendingInvitation { id: number; email: string; role: StudioRole; expiresAt: string }
export interface StudioMembers { members: StudioMember[]; invitations: PendingInvitation[] }
export interface InvitationView { studioName: string; role: StudioRole; email: string; hasAccount: boolean }

export interface YarnListItem { id: number; name: string; hex: string; weightCategory: number; metresPer100g: number; gramsOnHand: number }
