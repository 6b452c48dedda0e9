import { afterAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio, makeUser } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'

// Sessions are sealed cookies naming a row in user_sessions: ending the row ends the cookie,
// wherever copies of it are. Each test copies a cookie the way a thief would and tries it.
afterAll(closeTestDb)

/** A second client holding a copy of another's cookie. */
function copyOf(client: ApiClient) {
  const thief = apiClient()
  thief.cookie = client.cookie
  return thief
}

async function readsAndWrites(client: ApiClient, studioId: number) {
  const read = (await client.get('/api/me')).status
  const write = (await client.post('/api/yarns', { studioId, name: `Copy ${Math.random()}`, hex: '#aa3344', weightCategory: 1, metresPer100g: 400 })).status
  return { read, write }
}

describe('revocable sessions', () => {
  it('sign-out ends the session: a copied cookie neither reads nor writes afterwards', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const copy = copyOf(owner)
    expect(await readsAndWrites(copy, f.studio.id)).toEqual({ read: 200, write: 201 })
    expect((await owner.post('/api/auth/logout')).status).toBe(200)
    expect(await readsAndWrites(copy, f.studio.id)).toEqual({ read: 401, write: 401 })
  })

  it('the module\'s own DELETE /api/_auth/session ends it too', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const copy = copyOf(owner)
    expect((await owner.delete('/api/_auth/session')).status).toBe(200)
    expect(await readsAndWrites(copy, f.studio.id)).toEqual({ read: 401, write: 401 })
    // …and its session read answers "nobody" for the copy.
    expect((await copy.get('/api/_auth/session')).body?.user).toBeUndefined()
  })

  it('signing in issues a new session id: the cookie from before stops working', async () => {
    const user = await makeUser('resign')
    const client = await signedIn(user.email, fixturePassword)
    const before = copyOf(client)
    expect((await client.post('/api/auth/login', { email: user.email, password: fixturePassword })).status).toBe(200)
    expect(client.cookie).not.toBe(before.cookie)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await before.get('/api/me')).status).toBe(401)
  })

  it('a password reset ends every session of the account', async () => {
    const user = await makeUser('reset-ends')
    const tablet = await signedIn(user.email, fixturePassword)
    const phone = await signedIn(user.email, fixturePassword)
    expect((await apiClient().post('/api/auth/password-reset', { email: user.email })).status).toBe(202)
    const token = linkIn(await waitForMail(user.email), '/reset-password').searchParams.get('token')
    expect((await apiClient().post('/api/auth/password-reset/confirm', { token, password: 'a-new-password-1' })).status).toBe(200)
    expect((await tablet.get('/api/me')).status).toBe(401)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await signedIn(user.email, 'a-new-password-1').then(c => c.get('/api/me'))).status).toBe(200)
  })

  it('a password change ends the person\'s other sessions and keeps this one', async () => {
    const user = await makeUser('change-ends')
    const here = await signedIn(user.email, fixturePassword)
    const elsewhere = await signedIn(user.email, fixturePassword)
    const wrong = await here.post('/api/me/password', { current: 'not-the-password', password: 'another-password-2' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.message).toMatch(/current/)
    const res = await here.post('/api/me/password', { current: fixturePassword, password: 'another-password-2' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.message).toMatch(/1 other device/)
    expect((await here.get('/api/me')).status).toBe(200)
    expect((await elsewhere.get('/api/me')).status).toBe(401)
  })

  it('an owner removing a member ends that member\'s sessions', async () => {
    const f = await makeStudio(1)
    const spare = f.spares[0]!
    const member = await signedIn(spare.email, fixturePassword)
    expect((await member.get(`/api/yarns?studioId=${f.studio.id}`)).status).toBe(200)
    const owner = await signedIn(f.owner.email, fixturePassword)
    expect((await owner.delete(`/api/studios/${f.studio.id}/members/${spare.id}`)).status).toBe(204)
    expect((await member.get('/api/me')).status).toBe(401)
    expect((await owner.get('/api/me')).status).toBe(200)
  })

  it('the account page lists devices; one can be ended, or all but this one', async () => {
    const user = await makeUser('devices')
    const tablet = await signedIn(user.email, fixturePassword)
    const phone = await signedIn(user.email, fixturePassword)
    const laptop = await signedIn(user.email, fixturePassword)
    const list = await tablet.get('/api/me/sessions')
    expect(list.status).toBe(200)
    expect(list.body).toHaveLength(3)
    expect(list.body[0]).toMatchObject({ current: true })
    expect(list.body.filter((s: { current: boolean }) => s.current)).toHaveLength(1)
    const phoneId = (await phone.get('/api/me/sessions')).body.find((s: { current: boolean }) => s.current).id
    expect((await tablet.delete(`/api/me/sessions/${phoneId}`)).status).toBe(204)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await tablet.delete(`/api/me/sessions/${phoneId}`)).status).toBe(404) // already ended
    expect((await tablet.delete('/api/me/sessions')).body).toEqual({ ended: 1 })
    expect((await laptop.get('/api/me')).status).toBe(401)
    expect((await tablet.get('/api/me/sessions')).body).toHaveLength(1)
  })

  it('another person\'s session id is not found, and theirs stays', async () => {
    const a = await makeUser('own-a')
    const b = await makeUser('own-b')
    const clientA = await signedIn(a.email, fixturePassword)
    const clientB = await signedIn(b.email, fixturePassword)
    const idOfB = (await clientB.get('/api/me/sessions')).body[0].id
    expect((await clientA.delete(`/api/me/sessions/${idOfB}`)).status).toBe(404)
    expect((await clientB.get('/api/me')).status).toBe(200)
  })
})
