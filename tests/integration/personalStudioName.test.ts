import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, uniqueEmail, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'

// A new account's personal studio is named "<name>’s studio", in a column as long as the name's
// own (120): a name that passed validation must never make the studio's overflow (a 500).

let s: Awaited<ReturnType<typeof makeStudio>>
let owner: ApiClient
beforeAll(async () => {
  s = await makeStudio()
  owner = await signedIn(s.owner.email, fixturePassword)
})
afterAll(closeTestDb)

/** Names of 112–120 characters: a personal studio named "<name>’s studio" passes 120 with each. */
const longNames = Array.from({ length: 9 }, (_, i) => 112 + i).map(n => [n, `${'Long name '.repeat(12).slice(0, n - 1)}z`] as const)

function expectPersonalStudioOf(name: string, studios: { name: string; personal: boolean }[]) {
  const personal = studios.find(x => x.personal)!
  expect(personal.name.length).toBeLessThanOrEqual(120)
  // The person's name is cut with an ellipsis, never the word "studio".
  expect(personal.name).toMatch(/…’s studio$/)
  expect(name.startsWith(personal.name.slice(0, -'…’s studio'.length))).toBe(true)
}

describe('a personal studio named after a long name', () => {
  it.each(longNames)('sign-up with a name of %i characters answers 201, as for a taken address', async (_, name) => {
    const email = uniqueEmail('long-name')
    const client = apiClient()
    const free = await client.post('/api/auth/register', { email, password: 'a-long-password', name })
    expect(free.status, JSON.stringify(free.body)).toBe(201)
    const taken = await apiClient().post('/api/auth/register', { email, password: 'other-password', name })
    expect(taken.status).toBe(free.status)
    expect(taken.body).toEqual(free.body)

    expect((await client.post('/api/auth/login', { email, password: 'a-long-password' })).status).toBe(200)
    const me = await client.get('/api/me')
    expect(me.body.user.name).toBe(name) // the person's own name is kept whole
    expectPersonalStudioOf(name, me.body.studios)
  })

  it.each(longNames)('accepting an invitation with a name of %i characters makes the account (200)', async (_, name) => {
    const email = uniqueEmail('long-invitee')
    expect((await owner.post(`/api/studios/${s.studio.id}/invitations`, { email, role: 'knitter' })).status).toBe(201)
    const token = linkIn(await waitForMail(email), '/invitations/').pathname.split('/').pop()!
    const accepted = await apiClient().post(`/api/invitations/${token}/accept`, { name, password: 'invitee-password-1' })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body.user.name).toBe(name)
    expect(accepted.body.studios).toContainEqual(expect.objectContaining({ id: s.studio.id, role: 'knitter' }))
    expectPersonalStudioOf(name, accepted.body.studios)
  })
})
