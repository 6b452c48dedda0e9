import { afterAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, uniqueEmail } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio, makeUser } from '../support/db'
import { mailTo, waitForMail } from '../support/mail'
import { Invitation, QueuedMail } from '../../server/db/models'

// Mail is queued in the request and sent after the answer: a reset for a known address takes
// the time of one for an unknown one. Every kind of mail a request causes has limits per
// recipient, per sender and per studio, answered with a clear 429.
afterAll(closeTestDb)

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!

async function timed(run: () => Promise<unknown>) {
  const start = performance.now()
  await run()
  return performance.now() - start
}

describe('mail after the answer', () => {
  it('a reset request takes the same time for a known and an unknown address', async () => {
    const known = await Promise.all(Array.from({ length: 12 }, (_, i) => makeUser(`timing-${i}`)))
    const client = apiClient()
    const times = { known: [] as number[], unknown: [] as number[] }
    await client.post('/api/auth/password-reset', { email: uniqueEmail('warm-up') })
    for (const user of known) {
      // Interleaved, so a slow moment of the machine hits both alike. A new client each time:
      // the per-address limit is not what this measures.
      times.known.push(await timed(() => apiClient().post('/api/auth/password-reset', { email: user.email })))
      times.unknown.push(await timed(() => apiClient().post('/api/auth/password-reset', { email: uniqueEmail('nobody') })))
    }
    const [k, u] = [median(times.known), median(times.unknown)]
    // Before the queue: ~120 ms against 2–3 ms. Now both are the same two queries.
    expect(Math.abs(k - u), `known ${k.toFixed(1)} ms, unknown ${u.toFixed(1)} ms`).toBeLessThan(Math.max(5, 0.5 * u))
    // …and the mail still comes, to the known addresses only.
    await waitForMail(known[0]!.email)
    await waitForMail(known.at(-1)!.email)
  })

  it('a sent mail keeps no copy of its link in the queue', async () => {
    const user = await makeUser('wiped')
    expect((await apiClient().post('/api/auth/password-reset', { email: user.email })).status).toBe(202)
    await waitForMail(user.email)
    await expect.poll(async () => (await QueuedMail.findOne({ where: { toAddress: user.email } }))?.sentAt).toBeTruthy()
    const row = (await QueuedMail.findOne({ where: { toAddress: user.email } }))!
    expect(row.body).toBeNull()
  })
})

describe('mail limits', () => {
  it('password links: at most 3 an hour to one address, known or not, then a clear 429', async () => {
    for (const email of [(await makeUser('reset-limit')).email, uniqueEmail('reset-limit-nobody')]) {
      for (let i = 0; i < 3; i++) expect((await apiClient().post('/api/auth/password-reset', { email })).status).toBe(202)
      const refused = await apiClient().post('/api/auth/password-reset', { email })
      expect(refused.status).toBe(429)
      expect(refused.body.message).toMatch(/Too many password links to this address: at most 3 in an hour\. Try again in \d+ minutes/)
      expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(3000)
    }
  })

  it('one network address may cause at most 20 sign-up or reset mails an hour', async () => {
    const client = apiClient() // one address for all
    for (let i = 0; i < 20; i++) expect((await client.post('/api/auth/password-reset', { email: uniqueEmail(`spray-${i}`) })).status).toBe(202)
    const refused = await client.post('/api/auth/register', { email: uniqueEmail('spray-more'), password: 'long-enough-pw', name: 'X' })
    expect(refused.status).toBe(429)
    expect(refused.body.message).toMatch(/mails asked for from your network address/)
  })

  it('invitations: at most 5 a day to one address, and a refused one leaves no invitation', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const email = uniqueEmail('invite-limit')
    for (let i = 0; i < 5; i++) expect((await owner.post(`/api/studios/${f.studio.id}/invitations`, { email, role: 'knitter' })).status).toBe(201)
    const refused = await owner.post(`/api/studios/${f.studio.id}/invitations`, { email, role: 'designer' })
    expect(refused.status).toBe(429)
    expect(refused.body.message).toMatch(/Too many invitations to this address: at most 5 in a day/)
    expect(await Invitation.count({ where: { email } })).toBe(5)
    await waitForMail(email, 5)
    expect(mailTo(email)).toHaveLength(5)
  })

  it('invitations: one person sends at most 30 an hour', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    for (let i = 0; i < 30; i++)
      expect((await owner.post(`/api/studios/${f.studio.id}/invitations`, { email: uniqueEmail('many'), role: 'knitter' })).status).toBe(201)
    const refused = await owner.post(`/api/studios/${f.studio.id}/invitations`, { email: uniqueEmail('many'), role: 'knitter' })
    expect(refused.status).toBe(429)
    expect(refused.body.message).toMatch(/invitations sent by you/)
  })

  it('limits hold under a burst: 10 parallel resets to one address never queue more than 3', async () => {
    const user = await makeUser('burst')
    const answers = await Promise.all(Array.from({ length: 10 }, () => apiClient().post('/api/auth/password-reset', { email: user.email })))
    const accepted = answers.filter(r => r.status === 202).length
    // Each request writes its row before counting, so a burst can only err on the side of refusing.
    expect(accepted).toBeLessThanOrEqual(3)
    expect(answers.filter(r => r.status === 429)).toHaveLength(10 - accepted)
    expect(await QueuedMail.count({ where: { toAddress: user.email } })).toBe(accepted)
  })
})
