import type { H3Event } from 'h3'
import { Op, QueryTypes, Transaction } from 'sequelize'
import { PasswordReset, QueuedMail, User } from '../db/models'

// Mail is written to `mail_queue` inside the request and sent after the answer by the loop in
// server/plugins/mailQueue.ts: a route answers in the same time whether or not a mail follows
// (no account enumeration by timing), a mail server that is down costs no request, and a
// server that stops mid-way sends the rest when it starts again. The rows are also the count
// the limits below read.

export type MailKind = 'password-reset' | 'invitation' | 'confirm-address' | 'account-exists' | 'welcome' | 'project-finished' | 'sign-in-warning'

interface Limit { count: number; windowMs: number; of: 'recipient' | 'senderUser' | 'senderAddress' | 'studio'; kinds: MailKind[]; say: string }

const hour = 60 * 60_000
const day = 24 * hour
// What one recipient, one person, one network address and one studio may cause. Refused
// mails are not queued and not counted (hammering does not extend the wait).
const limits: Limit[] = [
  { of: 'recipient', kinds: ['password-reset'], count: 3, windowMs: hour, say: 'password links to this address' },
  { of: 'recipient', kinds: ['confirm-address', 'account-exists', 'welcome'], count: 3, windowMs: hour, say: 'sign-up mails to this address' },
  { of: 'recipient', kinds: ['invitation'], count: 5, windowMs: day, say: 'invitations to this address' },
  {
    of: 'senderAddress',
    kinds: ['password-reset', 'confirm-address', 'account-exists', 'welcome'],
    count: 20,
    windowMs: hour,
    say: 'mails asked for from your network address',
  },
  { of: 'senderUser', kinds: ['invitation'], count: 30, windowMs: hour, say: 'invitations sent by you' },
  { of: 'studio', kinds: ['invitation'], count: 100, windowMs: day, say: 'invitations from this studio' },
]

export interface MailToQueue {
  kind: MailKind
  to: string
  subject?: string
  /** Empty for a password reset: its link is made when it is sent (see deliver). */
  text?: string
  senderUserId?: number | null
  studioId?: number | null
}

/** Queues a mail caused by a request, or throws 429 (with Retry-After) when a limit is reached. */
export async function queueMail(event: H3Event | null, mail: MailToQueue) {
  const row = await QueuedMail.create({
    kind: mail.kind,
    toAddress: mail.to.toLowerCase(),
    senderUserId: mail.senderUserId ?? null,
    senderAddress: event ? clientAddress(event).slice(0, 64) : '',
    studioId: mail.studioId ?? null,
    subject: (mail.subject ?? '').slice(0, 200),
    body: mail.text ?? '',
    // Held back until the limits below have passed it: a refused mail is never sent.
    nextAttemptAt: new Date(Date.now() + 10 * 60_000),
  })
  // Written before counted, so parallel requests cannot all pass the count (as throttle.ts).
  if (event) {
    const refused = await limitReached(row)
    if (refused) {
      await row.destroy()
      const retryAfter = Math.max(1, Math.ceil(refused.retryAfterMs / 1000))
      setResponseHeader(event, 'Retry-After', retryAfter)
      throw createError({
        statusCode: 429,
        message: `Too many ${refused.limit.say}: at most ${refused.limit.count} in ${describeWindow(refused.limit.windowMs)}. Try again in ${describeWait(retryAfter)}.`,
      })
    }
  }
  await row.update({ nextAttemptAt: new Date() })
  void kickMailQueue()
  return row
}

function describeWindow(ms: number) {
  return ms >= day ? `${ms / day === 1 ? 'a day' : `${ms / day} days`}` : `${ms / hour === 1 ? 'an hour' : `${ms / hour} hours`}`
}
function describeWait(seconds: number) {
  return seconds < 120 ? `${seconds} seconds` : seconds < 7200 ? `${Math.ceil(seconds / 60)} minutes` : `${Math.ceil(seconds / 3600)} hours`
}

async function limitReached(row: QueuedMail) {
  for (const limit of limits) {
    if (!limit.kinds.includes(row.kind as MailKind)) continue
    const key = {
      recipient: { toAddress: row.toAddress },
      senderUser: { senderUserId: row.senderUserId },
      senderAddress: { senderAddress: row.senderAddress },
      studio: { studioId: row.studioId },
    }[limit.of]
    if (Object.values(key)[0] === null || Object.values(key)[0] === '') continue
    const since = new Date(Date.now() - limit.windowMs)
    const recent = await QueuedMail.findAll({
      where: { ...key, kind: limit.kinds, createdAt: { [Op.gt]: since } },
      order: [['createdAt', 'DESC'], ['id', 'DESC']],
      limit: limit.count + 1,
      attributes: ['createdAt'],
    })
    if (recent.length > limit.count) {
      return { limit, retryAfterMs: recent[recent.length - 1]!.createdAt.getTime() + limit.windowMs - Date.now() }
    }
  }
  return null
}

// ---- sending -------------------------------------------------------------------------

const resetLifetimeMs = hour
const backoffMs = [5_000, 30_000, 120_000, 600_000, 1_800_000]
let running: Promise<void> | undefined
let again = false

/** Sends what is due now (again at once if more came in meanwhile). Safe to call often. */
export function kickMailQueue() {
  if (running) { again = true; return running }
  running = (async () => {
    try {
      do { again = false; await sendDue() } while (again)
    }
    catch (error) {
      console.error('The mail queue could not be read', error)
    }
    finally { running = undefined }
  })()
  return running
}

// A claimed mail is leased for this long: a server that dies while sending leaves it to be
// picked up again (a mail may then go twice, never not at all).
const leaseMs = 120_000

async function sendDue() {
  for (;;) {
    // Claimed in a short transaction (READ COMMITTED: no gap locks that would hold up the
    // routes' inserts); rows another server has locked are skipped, so no mail goes twice.
    const ids = await useDb().transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
      const due = await useDb().query<{ id: number }>(
        'SELECT id FROM mail_queue WHERE sent_at IS NULL AND failed_at IS NULL AND next_attempt_at <= ? ORDER BY id LIMIT 10 FOR UPDATE SKIP LOCKED',
        { replacements: [new Date()], type: QueryTypes.SELECT, transaction },
      )
      const claimed = due.map(d => Number(d.id))
      if (claimed.length) await QueuedMail.update({ nextAttemptAt: new Date(Date.now() + leaseMs) }, { where: { id: claimed }, transaction })
      return claimed
    })
    if (ids.length === 0) return
    // The claimed batch goes out together (the transport pools its connections).
    await Promise.all(ids.map(sendOne))
  }
}

// A mail server that stops answering must not hold up the queue: the mail is retried later.
const sendTimeoutMs = 30_000
function withTimeout<T>(work: Promise<T>, ms: number) {
  let timer: NodeJS.Timeout | undefined
  const late = new Promise<never>((_, reject) => { timer = setTimeout(() => reject(new Error(`no answer from the mail server within ${ms / 1000} s`)), ms) })
  return Promise.race([work, late]).finally(() => clearTimeout(timer))
}

async function sendOne(id: number) {
  const mail = await QueuedMail.findByPk(id)
  if (!mail || mail.sentAt) return
  try {
    const delivered = await withTimeout(deliver(mail), sendTimeoutMs)
    await mail.update({ sentAt: new Date(), body: null, subject: delivered ? mail.subject : '(no account: nothing sent)', lastError: null })
  }
  catch (error) {
    const attempts = mail.attempts + 1
    const wait = backoffMs[attempts - 1]
    await mail.update({
      attempts,
      lastError: String((error as Error)?.message ?? error).slice(0, 255),
      ...(wait === undefined ? { failedAt: new Date(), body: null } : { nextAttemptAt: new Date(Date.now() + wait) }),
    })
  }
}

/** Sends one queued mail; false when there was nobody to send it to (a reset for no account). */
async function deliver(mail: QueuedMail) {
  if (mail.kind === 'password-reset') {
    const user = await User.findOne({ where: { email: mail.toAddress } })
    if (!user) return false
    const { token, hash } = newLinkToken()
    await PasswordReset.create({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + resetLifetimeMs) })
    await sendMail({
      to: user.email,
      subject: 'Set a new Floatwise password',
      text: `Someone asked to set a new password for your Floatwise account. The link works once, for one hour:\n${appLink(`/reset-password?token=${token}`)}\n\nIf it was not you, ignore this mail: your password stays as it is.`,
    })
    return true
  }
  await sendMail({ to: mail.toAddress, subject: mail.subject, text: mail.body ?? '' })
  return true
}
