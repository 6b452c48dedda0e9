import { afterAll, describe, expect, it } from 'vitest'
import { apiClient, uniqueEmail } from '../support/api'
import { closeTestDb, makeUser } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'

afterAll(closeTestDb)

// The mail fake's inbox holds live reset and invitation tokens: reading it from the app's
// port (which tablets on the workroom's network reach) was an account takeover.
describe('the app server never serves the mail fake', () => {
  it('answers 404 for the old inbox paths, under any Host, while a reset mail with a live token exists', async () => {
    const user = await makeUser('inbox-victim')
    const attacker = apiClient()
    expect((await attacker.post('/api/auth/password-reset', { email: user.email })).status).toBe(202)
    const token = linkIn(await waitForMail(user.email), '/reset-password').searchParams.get('token')!
    for (const path of ['/api/dev/mail', '/dev/mail', '/dev/mail/', '/dev/anything']) {
      for (const host of [undefined, 'localhost', 'evil.example']) {
        const res = await attacker.get(path, host ? { host } : {})
        expect(res.status, `${path} host=${host}`).toBe(404)
        expect(JSON.stringify(res.body)).not.toContain(token)
        expect(JSON.stringify(res.body)).not.toContain(user.email)
      }
    }
  })

  it('still sends the mail (the tests and the viewer read the capture folder, not the app)', async () => {
    const email = uniqueEmail('inbox-reader')
    await apiClient().post('/api/auth/register', { email, password: 'inbox-password-1', name: 'Reader' })
    expect((await waitForMail(email)).subject).toBeTruthy()
  })
})
