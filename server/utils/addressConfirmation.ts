import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import { EmailConfirmation, type User } from '../db/models'

const lifetimeMs = 7 * 24 * 60 * 60_000

/** Queues the mail with a single-use link (seven days) that confirms the person owns the address. */
export async function queueAddressConfirmation(event: H3Event, user: User, transaction?: Transaction) {
  const { token, hash } = newLinkToken()
  await EmailConfirmation.create({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + lifetimeMs) }, { transaction })
  await queueMail(event, {
    kind: 'confirm-address',
    to: user.email,
    senderUserId: user.id,
    subject: 'Confirm your address for Floatwise',
    text: `Your Floatwise account is ready, with a personal studio of your own. Confirm that this address is yours (the link works once, for seven days):\n${appLink(`/confirm-address?token=${token}`)}\n\nUntil then you can knit and design in your own studio, but not join another studio.\nIf you did not make this account, ignore this mail: it cannot be used to join any studio.`,
  })
}

/** Refuses, with what to do, a person whose address is not confirmed yet. */
export function requireConfirmedAddress(user: User) {
  if (!user.emailConfirmedAt) {
    throw createError({
      statusCode: 403,
      message: `Confirm your address first: open the link we mailed to ${user.email} (your account page can send it again)`,
    })
  }
}
