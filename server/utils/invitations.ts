import type { H3Event } from 'h3'
import { Invitation, Studio } from '../db/models'
import type { StudioRole } from '#shared/types/studio'

const lifetimeMs = 7 * 24 * 60 * 60_000

/**
 * Invites an address into a studio with a role and mails the single-use link (7 days).
 * `then` is where the app takes the person after accepting (e.g. a shared plan).
 */
export async function inviteToStudio(
  event: H3Event,
  input: { studioId: number; email: string; role: StudioRole; invitedBy: { id: number; name: string }; why?: string; then?: string },
) {
  const studio = await Studio.findByPk(input.studioId)
  const { token, hash } = newLinkToken()
  const invitation = await Invitation.create({
    studioId: input.studioId,
    email: input.email,
    role: input.role,
    tokenHash: hash,
    invitedBy: input.invitedBy.id,
    expiresAt: new Date(Date.now() + lifetimeMs),
  })
  const link = appLink(`/invitations/${token}${input.then ? `?then=${encodeURIComponent(input.then)}` : ''}`)
  try {
    await queueMail(event, {
      kind: 'invitation',
      to: input.email,
      senderUserId: input.invitedBy.id,
      studioId: input.studioId,
      subject: `${input.invitedBy.name} invites you to ${studio!.name} on Floatwise`,
      text: `${input.invitedBy.name} invites you to join ${studio!.name} on Floatwise as ${input.role}.${input.why ? ` ${input.why}` : ''} The link works once, for seven days:\n${link}`,
    })
  }
  catch (error) {
    await invitation.destroy() // refused by a mail limit: no invitation without its mail
    throw error
  }
  return invitation
}
