import { afterAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, uniqueEmail } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { linkIn, mailTo, waitForMail } from '../support/mail'

// Sign-up mails a link that confirms the address. Until it is opened the account has its own
// studio but joins no other; opening it (or a password reset, which proves the same) ends
// every other session, so a squatter who registered someone else's address is shut out.
afterAll(closeTestDb)

async function register(email: string, password = 'squatter-password') {
  const res = await apiClient().post('/api/auth/register', { email, password, name: 'Someone' })
  expect(res.status).toBe(201)
}

async function invite(studioId: number, ownerEmail: string, email: string) {
  const owner = await signedIn(ownerEmail, fixturePassword)
  const before = mailTo(email).length
  expect((await owner.post(`/api/studios/${studioId}/invitations`, { email, role: 'knitter' })).status).toBe(201)
  const mail = await waitForMail(email, before + 1)
  return linkIn(mail, '/invitations/').pathname.split('/').pop()!
}

describe('address confirmation', () => {
  it('an unconfirmed account cannot accept an invitation until its address is confirmed', async () => {
    const f = await makeStudio()
    const email = uniqueEmail('unconfirmed')
    await register(email, 'my-own-password')
    const me = await signedIn(email, 'my-own-password')
    expect((await me.get('/api/me')).body.emailConfirmed).toBe(false)
    const confirmLink = linkIn(await waitForMail(email), '/confirm-address')

    const token = await invite(f.studio.id, f.owner.email, email)
    const refused = await me.post(`/api/invitations/${token}/accept`, {})
    expect(refused.status).toBe(403)
    expect(refused.body.message).toMatch(/Confirm your address/)
    expect((await me.get(`/api/yarns?studioId=${f.studio.id}`)).status).toBe(404) // not a member

    const confirmed = await me.post('/api/auth/confirm-address', { token: confirmLink.searchParams.get('token') })
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200)
    expect((await me.get('/api/me')).body.emailConfirmed).toBe(true)
    expect((await me.post(`/api/invitations/${token}/accept`, {})).status).toBe(200)
    expect((await me.get(`/api/yarns?studioId=${f.studio.id}`)).status).toBe(200)
    // The link worked once.
    expect((await me.post('/api/auth/confirm-address', { token: confirmLink.searchParams.get('token') })).status).toBe(400)
  })

  it('a squatter who registered someone else\'s address loses access when the owner resets the password', async () => {
    const f = await makeStudio()
    const victim = uniqueEmail('victim')
    await register(victim) // the squatter signs up with the victim's address…
    const squatter = await signedIn(victim, 'squatter-password') // …and keeps the cookie
    expect((await squatter.get('/api/me')).status).toBe(200)

    // The real person asks for a new password, sets it, and accepts an invitation.
    expect((await apiClient().post('/api/auth/password-reset', { email: victim })).status).toBe(202)
    const resetMail = await waitForMail(victim, 2)
    const resetToken = linkIn(resetMail, '/reset-password').searchParams.get('token')
    expect((await apiClient().post('/api/auth/password-reset/confirm', { token: resetToken, password: 'the-real-password' })).status).toBe(200)
    const owner = await signedIn(victim, 'the-real-password')
    expect((await owner.get('/api/me')).body.emailConfirmed).toBe(true) // the reset link proves the address
    const token = await invite(f.studio.id, f.owner.email, victim)
    expect((await owner.post(`/api/invitations/${token}/accept`, {})).status).toBe(200)

    // The squatter's old cookie reads nothing, neither the account nor the studio.
    expect((await squatter.get('/api/me')).status).toBe(401)
    expect((await squatter.get(`/api/yarns?studioId=${f.studio.id}`)).status).toBe(401)
  })

  it('confirming ends every other session of the account, and keeps the one that confirmed', async () => {
    const email = uniqueEmail('confirm-ends')
    await register(email, 'my-own-password')
    const here = await signedIn(email, 'my-own-password')
    const other = await signedIn(email, 'my-own-password')
    const token = linkIn(await waitForMail(email), '/confirm-address').searchParams.get('token')
    expect((await here.post('/api/auth/confirm-address', { token })).status).toBe(200)
    expect((await here.get('/api/me')).status).toBe(200)
    expect((await other.get('/api/me')).status).toBe(401)
  })

  it('the link can be sent again, within the mail limit', async () => {
    const email = uniqueEmail('resend')
    await register(email, 'my-own-password')
    const me = await signedIn(email, 'my-own-password')
    expect((await me.post('/api/me/confirmation-mail')).status).toBe(202)
    expect((await me.post('/api/me/confirmation-mail')).status).toBe(202)
    const limited = await me.post('/api/me/confirmation-mail') // the fourth sign-up mail in the hour
    expect(limited.status).toBe(429)
    expect(limited.body.message).toMatch(/sign-up mails to this address/)
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(0)
    const third = await waitForMail(email, 3)
    // The newest link works.
    expect((await me.post('/api/auth/confirm-address', { token: linkIn(third, '/confirm-address').searchParams.get('token') })).status).toBe(200)
    expect((await me.post('/api/me/confirmation-mail')).status).toBe(409)
  })
})
