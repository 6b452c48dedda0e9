import { randomBytes } from 'node:crypto'
import { setTimeout as sleep } from 'node:timers/promises'
import { afterAll, describe, expect, it } from 'vitest'
import { Op } from 'sequelize'
import { apiClient, uniqueEmail } from '../support/api'
import { closeTestDb, fixturePassword, makeUser, testDb } from '../support/db'
import { linkIn, mailTo, waitForMail } from '../support/mail'
import { SignInFailure } from '../../server/db/models'

// Throttling by account and by network address (server/utils/throttle.ts). Failures older
// than a test can wait for are written straight into sign_in_failures, back-dated.
afterAll(closeTestDb)

const second = 1000
const minute = 60 * second

/** An address no other test uses (the IPv6 documentation range), as our proxy forwards it. */
function freshAddress() {
  const groups = randomBytes(8).toString('hex').match(/.{4}/g)!
  return `2001:db8:${groups.join(':')}::1`
}

function signIn(address: string, email: string, password: string) {
  return apiClient().post('/api/auth/login', { email, password }, { 'x-forwarded-for': address })
}

/** Failed sign-ins already on record, each `agesMs[i]` before now, from `addressOf(i)`. */
async function pastFailures(email: string, addressOf: (i: number) => string, agesMs: number[]) {
  testDb()
  const now = Date.now()
  await SignInFailure.bulkCreate(agesMs.map((age, i) => ({ email, address: addressOf(i), at: new Date(now - age) })))
}

/** Wrong passwords from one address until `count` of them reached the password check, waiting out each 429. */
async function wrongPasswords(address: string, email: string, count: number) {
  const statuses: number[] = []
  while (statuses.filter(s => s === 401).length < count) {
    const res = await signIn(address, email, 'wrong-password')
    statuses.push(res.status)
    const wait = Number(res.headers.get('retry-after'))
    if (res.status === 429 && wait > 5) throw new Error(`sign-in refused for ${wait} s: ${res.body.message}`)
    if (res.status === 429) await sleep(wait * second + 50)
    else expect(res.status).toBe(401)
  }
  return statuses
}

function failuresOf(email: string, address?: string) {
  testDb()
  return SignInFailure.count({ where: { email, ...(address ? { address } : {}) } })
}

describe('sign-in throttling by account and address', () => {
  it('lets the owner sign in from a clean address right after five wrong passwords from another', async () => {
    const owner = await makeUser('owner')
    await wrongPasswords(freshAddress(), owner.email, 5)
    const res = await signIn(freshAddress(), owner.email, fixturePassword)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
  })

  it('makes each refusal from one address wait longer, and does not count the refused attempt', async () => {
    const user = await makeUser('delay')
    const address = freshAddress()
    // Four failures ten minutes ago (their 2 s wait is over); the fifth now means 4 s, the sixth 8 s.
    await pastFailures(user.email, () => address, [10, 11, 12, 13].map(m => m * minute))
    expect((await signIn(address, user.email, 'wrong-password')).status).toBe(401)
    const first = await signIn(address, user.email, 'wrong-password')
    expect(first.status).toBe(429)
    const firstWait = Number(first.headers.get('retry-after'))
    expect(firstWait).toBeGreaterThanOrEqual(2)
    expect(firstWait).toBeLessThanOrEqual(4)
    expect(first.body.message).toBe(`Too many failed sign-ins from this address. Try again in ${firstWait} seconds.`)
    expect(await failuresOf(user.email)).toBe(5)

    await sleep(firstWait * second + 50)
    expect((await signIn(address, user.email, 'wrong-password')).status).toBe(401)
    const next = await signIn(address, user.email, fixturePassword)
    expect(next.status).toBe(429)
    const nextWait = Number(next.headers.get('retry-after'))
    expect(nextWait).toBeGreaterThanOrEqual(6)
    expect(nextWait).toBeLessThanOrEqual(8)
    expect(next.body.message).toBe(`Too many failed sign-ins from this address. Try again in ${nextWait} seconds.`)
  })

  it('caps the wait for one address at 15 minutes, however many failures it has', async () => {
    const user = await makeUser('cap')
    const address = freshAddress()
    // Forty failures over the last day, the newest a minute ago: 2^37 s uncapped.
    await pastFailures(user.email, () => address, [1 * minute, ...Array.from({ length: 39 }, (_, i) => 2 * 60 * minute + i * 10 * minute)])
    const res = await signIn(address, user.email, fixturePassword)
    expect(res.status).toBe(429)
    const wait = Number(res.headers.get('retry-after'))
    expect(wait).toBeGreaterThan(13 * 60)
    expect(wait).toBeLessThanOrEqual(14 * 60)
    expect(res.body.message).toBe('Too many failed sign-ins from this address. Try again in 14 minutes.')
  })

  it('refuses every account from an address past 20 failures in 15 minutes, the right password too', async () => {
    const user = await makeUser('sprayed')
    const address = freshAddress()
    testDb()
    const now = Date.now()
    await SignInFailure.bulkCreate(
      Array.from({ length: 20 }, (_, i) => ({ email: uniqueEmail('spray'), address, at: new Date(now - 10 * minute + i * second) })),
    )
    const res = await signIn(address, user.email, fixturePassword)
    expect(res.status).toBe(429)
    // The oldest of the twenty leaves the window in five minutes.
    const wait = Number(res.headers.get('retry-after'))
    expect(wait).toBeGreaterThan(4 * 60)
    expect(wait).toBeLessThanOrEqual(5 * 60)
    expect(res.body.message).toBe('Too many failed sign-ins from this address. Try again in 5 minutes.')
    expect((await signIn(freshAddress(), user.email, fixturePassword)).status).toBe(200)
  })

  it('slows an account attacked from many addresses only after 50 failures, and by 30 seconds at most', async () => {
    const user = await makeUser('spread')
    const ages = (count: number, newest: number) => Array.from({ length: count }, (_, i) => newest + i * 10 * second)
    await pastFailures(user.email, freshAddress, ages(49, 2 * second))
    expect((await signIn(freshAddress(), user.email, 'wrong-password')).status).toBe(401)

    // Sixty-odd failures, the newest just now: the wait is the cap, not 2^10 s.
    await pastFailures(user.email, freshAddress, ages(11, 1 * second))
    const slowed = await signIn(freshAddress(), user.email, fixturePassword)
    expect(slowed.status).toBe(429)
    expect(Number(slowed.headers.get('retry-after'))).toBeGreaterThanOrEqual(28)
    expect(Number(slowed.headers.get('retry-after'))).toBeLessThanOrEqual(30)
    expect(slowed.body.message).toMatch(/^Too many failed sign-ins for this account\. Try again in (28|29|30) seconds\.$/)

    // Once the newest failure is 30 seconds old, the owner is in.
    testDb()
    await SignInFailure.update(
      { at: new Date(Date.now() - 31 * second) },
      { where: { email: user.email, at: { [Op.gt]: new Date(Date.now() - 31 * second) } } },
    )
    expect((await signIn(freshAddress(), user.email, fixturePassword)).status).toBe(200)
  })

  it('lets at most two of a spread-out parallel burst reach the password check past 48 failures', async () => {
    const user = await makeUser('spreadburst')
    await pastFailures(user.email, freshAddress, Array.from({ length: 48 }, (_, i) => minute + i * second))
    const statuses = (await Promise.all(Array.from({ length: 12 }, () => signIn(freshAddress(), user.email, 'wrong-password')))).map(r => r.status)
    expect(statuses.filter(s => s !== 429).length, statuses.join(' ')).toBeLessThanOrEqual(2)
    expect(statuses.filter(s => s === 429).length).toBeGreaterThanOrEqual(10)
  })

  it('clears only the failures of the address that signed in', async () => {
    const user = await makeUser('clear')
    const [mine, theirs] = [freshAddress(), freshAddress()]
    await wrongPasswords(mine, user.email, 2)
    await wrongPasswords(theirs, user.email, 2)
    expect((await signIn(mine, user.email, fixturePassword)).status).toBe(200)
    expect(await failuresOf(user.email, mine)).toBe(0)
    expect(await failuresOf(user.email, theirs)).toBe(2)
  })
})

describe('the warning mail after repeated failures', () => {
  it('mails the owner once after ten failures within an hour, saying from how many addresses', async () => {
    const user = await makeUser('warned')
    const earlier = [freshAddress(), freshAddress(), freshAddress()]
    await pastFailures(user.email, i => earlier[i % 3]!, Array.from({ length: 8 }, (_, i) => 20 * minute + i * minute))
    const attacker = freshAddress()
    await wrongPasswords(attacker, user.email, 2)
    const mail = await waitForMail(user.email)
    expect(mail.subject).toBe('Failed sign-ins to your Floatwise account')
    expect(mail.text).toContain('10 times in the last hour, from 4 network addresses')
    expect(mail.text).toContain('Your password still holds')
    expect(linkIn(mail, '/forgot-password').pathname).toBe('/forgot-password')

    await wrongPasswords(freshAddress(), user.email, 3)
    await sleep(500)
    expect(mailTo(user.email)).toHaveLength(1)
  })

  it('warns again once the last warning is an hour old', async () => {
    const user = await makeUser('rewarned')
    await pastFailures(user.email, freshAddress, Array.from({ length: 9 }, (_, i) => 20 * minute + i * minute))
    await wrongPasswords(freshAddress(), user.email, 1)
    await waitForMail(user.email)
    // An hour later (everything on record moved back), ten new failures warn again.
    await testDb().query('UPDATE sign_in_failures SET at = at - INTERVAL 61 MINUTE WHERE email = ?', { replacements: [user.email] })
    await pastFailures(user.email, freshAddress, Array.from({ length: 9 }, (_, i) => 20 * minute + i * minute))
    await wrongPasswords(freshAddress(), user.email, 1)
    const again = await waitForMail(user.email, 2)
    expect(again.text).toContain('10 times in the last hour, from 10 network addresses')
  })

  it('mails nobody for an address without an account', async () => {
    const email = uniqueEmail('nobody')
    await pastFailures(email, freshAddress, Array.from({ length: 9 }, (_, i) => 20 * minute + i * minute))
    await wrongPasswords(freshAddress(), email, 2)
    await sleep(500)
    expect(mailTo(email)).toEqual([])
  })
})

describe('the client address behind our proxy', () => {
  it('counts an attempt under the address our proxy added, not the one the client wrote first', async () => {
    const user = await makeUser('forwarded')
    const address = freshAddress()
    testDb()
    await SignInFailure.bulkCreate(Array.from({ length: 20 }, () => ({ email: uniqueEmail('spray'), address, at: new Date() })))
    const res = await apiClient().post(
      '/api/auth/login',
      { email: user.email, password: fixturePassword },
      { 'x-forwarded-for': `${freshAddress()}, ${address}` },
    )
    expect(res.status).toBe(429)
  })

  it('answers a forwarded value that is not an address like any other sign-in, never with a 500', async () => {
    const user = await makeUser('garbage')
    const res = await apiClient().post('/api/auth/login', { email: user.email, password: fixturePassword }, { 'x-forwarded-for': 'x'.repeat(100) })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
  })
})
