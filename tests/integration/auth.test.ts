import { afterAll, describe, expect, it } from 'vitest'
import { Op } from 'sequelize'
import { apiClient, uniqueEmail, type ApiResponse } from '../support/api'
import { linkIn, mailTo, waitForMail } from '../support/mail'
import { closeTestDb, testDb } from '../support/db'
import { PasswordReset, QueuedMail } from '../../server/db/models'

afterAll(closeTestDb)

describe('accounts', () => {
  it('registers, signs in, knows who is signed in, and signs out', async () => {
    const email = uniqueEmail('reg')
    const client = apiClient()
    const reg = await client.post('/api/auth/register', { email, password: 'a-long-password', name: 'Ada Tester' })
    expect(reg.status).toBe(201)

    const login = await client.post('/api/auth/login', { email: email.toUpperCase(), password: 'a-long-password' })
    expect(login.status).toBe(200)
    expect(login.headers.getSetCookie().join()).toMatch(/nuxt-session=.*HttpOnly/i)

    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user).toEqual({ id: expect.any(Number), email, name: 'Ada Tester' })
    // Sign-up makes a personal studio owned by the new person.
    expect(me.body.studios).toEqual([{ id: expect.any(Number), name: 'Ada Tester’s studio', role: 'owner', personal: true }])

    expect((await client.post('/api/auth/logout')).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
  })

  it('answers a sign-up for a registered address exactly like a new one, and mails the owner', async () => {
    const email = uniqueEmail('twice')
    const first = await apiClient().post('/api/auth/register', { email, password: 'first-password', name: 'First' })
    const second = await apiClient().post('/api/auth/register', { email, password: 'other-password', name: 'Second' })
    expect(second.status).toBe(first.status)
    expect(second.body).toEqual(first.body)
    await waitForMail(email, 2)
    expect(mailTo(email).map(m => m.subject)).toEqual(['Confirm your address for Floatwise', 'Someone tried to make a Floatwise account with your address'])
    // The original password still works; the second one never took.
    expect((await apiClient().post('/api/auth/login', { email, password: 'first-password' })).status).toBe(200)
    expect((await apiClient().post('/api/auth/login', { email, password: 'other-password' })).status).toBe(401)
  })

  it.each([
    [{ email: 'not-an-address', password: 'long-enough-pw', name: 'X' }, 'email'],
    [{ email: 'a@example.test', password: 'short', name: 'X' }, 'password'],
    [{ email: 'a@example.test', password: 'long-enough-pw', name: '' }, 'name'],
    [{ email: 'a@example.test', password: 'long-enough-pw' }, 'name'],
  ])('refuses a bad sign-up body %j with a 400 naming %s', async (body, field) => {
    const res = await apiClient().post('/api/auth/register', body)
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(`${field}:`)
    expect(res.body.data.issues.map((i: { path: string[] }) => i.path[0])).toContain(field)
    expect(JSON.stringify(res.body)).not.toMatch(/\bat .*\.(ts|js|mjs):\d+/)
  })

  it('gives the same 401 for an unknown address and a wrong password', async () => {
    const unknown = await apiClient().post('/api/auth/login', { email: uniqueEmail('nobody'), password: 'whatever-pw' })
    const wrong = await apiClient().post('/api/auth/login', { email: 'knitter@floatwise.test', password: 'wrong-password' })
    expect(unknown.status).toBe(401)
    expect(wrong.status).toBe(401)
    expect(unknown.body.message).toBe(wrong.body.message)
  })

  it('throttles sign-in from one address with a 429 and Retry-After, but not the account from fresh addresses', async () => {
    const email = uniqueEmail('throttle')
    await apiClient().post('/api/auth/register', { email, password: 'right-password', name: 'T' })
    const attacker = apiClient()
    const answers: ApiResponse[] = []
    for (let i = 0; i < 6; i++) answers.push(await attacker.post('/api/auth/login', { email, password: 'wrong-password' }))
    // Three free failures, then waits of 1, 2, 4… s: six quick tries cannot all reach the password check.
    expect(answers.slice(0, 3).map(a => a.status)).toEqual([401, 401, 401])
    const blocked = answers.find(a => a.status === 429)
    expect(blocked, answers.map(a => a.status).join(' ')).toBeDefined()
    expect(Number(blocked!.headers.get('retry-after'))).toBeGreaterThan(0)
    // Growing waits per address, not a lock on the account: the owner elsewhere is not held up.
    expect((await apiClient().post('/api/auth/login', { email, password: 'right-password' })).status).toBe(200)
  })

  it('holds the per-address limit under a burst of parallel attempts', async () => {
    const email = uniqueEmail('burst')
    await apiClient().post('/api/auth/register', { email, password: 'right-password', name: 'B' })
    const attacker = apiClient()
    const attempts = Array.from({ length: 30 }, (_, i) => attacker.post('/api/auth/login', { email, password: `wrong-password-${i}` }))
    const statuses = (await Promise.all(attempts)).map(r => r.status)
    // At most three attempts reach the password check (the free ones); every other one is a 429.
    expect(statuses.filter(s => s !== 429).length, statuses.join(' ')).toBeLessThanOrEqual(3)
    expect(statuses.filter(s => s === 429).length).toBeGreaterThanOrEqual(27)
  })

  it('throttles sign-in per address across accounts', async () => {
    const client = apiClient()
    const statuses: number[] = []
    for (let i = 0; i < 21; i++) statuses.push((await client.post('/api/auth/login', { email: uniqueEmail('spray'), password: 'wrong-password' })).status)
    expect(statuses.slice(0, 20).every(s => s === 401)).toBe(true)
    expect(statuses[20]).toBe(429)
  })
})

describe('password reset', () => {
  it('mails a single-use link that sets a new password', async () => {
    const email = uniqueEmail('reset')
    await apiClient().post('/api/auth/register', { email, password: 'old-password-1', name: 'R' })
    const ask = await apiClient().post('/api/auth/password-reset', { email })
    expect(ask.status).toBe(202)

    const mail = await waitForMail(email, 2)
    expect(mail.subject).toBe('Set a new Floatwise password')
    const token = linkIn(mail, '/reset-password').searchParams.get('token')!
    expect((await apiClient().post('/api/auth/password-reset/confirm', { token, password: 'new-password-2' })).status).toBe(200)
    expect((await apiClient().post('/api/auth/login', { email, password: 'new-password-2' })).status).toBe(200)
    expect((await apiClient().post('/api/auth/login', { email, password: 'old-password-1' })).status).toBe(401)

    const again = await apiClient().post('/api/auth/password-reset/confirm', { token, password: 'third-password-3' })
    expect(again.status).toBe(400)
    expect(again.body.message).toMatch(/expired or was already used/)
  })

  it('answers 202 for an unknown address and sends nothing', async () => {
    const email = uniqueEmail('ghost')
    const res = await apiClient().post('/api/auth/password-reset', { email })
    expect(res.status).toBe(202)
    // The request is queued like any other and settled by the sender: wait for that, not for a clock.
    testDb()
    await expect
      .poll(async () => (await QueuedMail.findOne({ where: { kind: 'password-reset', toAddress: email } }))?.sentAt ?? null, { timeout: 20_000 })
      .not.toBeNull()
    expect((await QueuedMail.findOne({ where: { toAddress: email } }))?.subject).toBe('(no account: nothing sent)')
    expect(mailTo(email)).toEqual([])
  })

  it('refuses an expired link', async () => {
    const email = uniqueEmail('late')
    await apiClient().post('/api/auth/register', { email, password: 'old-password-1', name: 'L' })
    await apiClient().post('/api/auth/password-reset', { email })
    const token = linkIn(await waitForMail(email, 2), '/reset-password').searchParams.get('token')!
    testDb()
    await PasswordReset.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { expiresAt: { [Op.gt]: new Date() } } })
    const res = await apiClient().post('/api/auth/password-reset/confirm', { token, password: 'new-password-2' })
    expect(res.status).toBe(400)
  })
})
