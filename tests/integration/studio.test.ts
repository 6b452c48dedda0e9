import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, uniqueEmail } from '../support/api'
import { linkIn, waitForMail } from '../support/mail'
import { closeTestDb, fixturePassword, makeStudio, makeUser } from '../support/db'
import { Invitation, Membership } from '../../server/db/models'

let s: Awaited<ReturnType<typeof makeStudio>>
beforeAll(async () => { s = await makeStudio() })
afterAll(closeTestDb)

describe('invitations', () => {
  it('an owner invites a new person by mail; the link makes their account and membership, once', async () => {
    const owner = await signedIn(s.owner.email, fixturePassword)
    const email = uniqueEmail('invitee')
    const sent = await owner.post(`/api/studios/${s.studio.id}/invitations`, { email, role: 'designer' })
    expect(sent.status).toBe(201)

    const mail = await waitForMail(email)
    expect(mail.subject).toContain(s.studio.name)
    const token = linkIn(mail, '/invitations/').pathname.split('/').pop()!

    const invitee = apiClient()
    const view = await invitee.get(`/api/invitations/${token}`)
    expect(view.body).toEqual({ studioName: s.studio.name, role: 'designer', email, hasAccount: false })

    const missing = await invitee.post(`/api/invitations/${token}/accept`, {})
    expect(missing.status).toBe(400)
    const accepted = await invitee.post(`/api/invitations/${token}/accept`, { name: 'New Designer', password: 'designer-pass-1' })
    expect(accepted.status).toBe(200)
    expect(accepted.body.studios).toContainEqual({ id: s.studio.id, name: s.studio.name, role: 'designer', personal: false })

    const reused = await apiClient().post(`/api/invitations/${token}/accept`, { name: 'Someone', password: 'another-pass-1' })
    expect(reused.status).toBe(404)
    const members = await owner.get(`/api/studios/${s.studio.id}/members`)
    expect(members.body.members.filter((m: { email: string }) => m.email === email)).toHaveLength(1)
  })

  it('an existing account must be signed in as the invited address to accept', async () => {
    const owner = await signedIn(s.owner.email, fixturePassword)
    const person = await makeUser('existing')
    await owner.post(`/api/studios/${s.studio.id}/invitations`, { email: person.email, role: 'knitter' })
    const token = linkIn(await waitForMail(person.email), '/invitations/').pathname.split('/').pop()!

    expect((await apiClient().post(`/api/invitations/${token}/accept`, {})).status).toBe(401)
    const someoneElse = await signedIn(s.designer.email, fixturePassword)
    expect((await someoneElse.post(`/api/invitations/${token}/accept`, {})).status).toBe(401)

    const invitee = await signedIn(person.email, fixturePassword)
    const accepted = await invitee.post(`/api/invitations/${token}/accept`, {})
    expect(accepted.status).toBe(200)
    expect(await Membership.findOne({ where: { studioId: s.studio.id, userId: person.id } })).toMatchObject({ role: 'knitter' })
  })

  it('an expired invitation is refused', async () => {
    const owner = await signedIn(s.owner.email, fixturePassword)
    const email = uniqueEmail('late')
    await owner.post(`/api/studios/${s.studio.id}/invitations`, { email, role: 'knitter' })
    const token = linkIn(await waitForMail(email), '/invitations/').pathname.split('/').pop()!
    await Invitation.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { email } })
    expect((await apiClient().get(`/api/invitations/${token}`)).status).toBe(404)
    expect((await apiClient().post(`/api/invitations/${token}/accept`, { name: 'Late', password: 'late-password-1' })).status).toBe(404)
  })
})

describe('members and roles', () => {
  it('the last owner can be neither demoted nor removed; with a second owner both work', async () => {
    const t = await makeStudio()
    const owner = await signedIn(t.owner.email, fixturePassword)
    const demote = await owner.patch(`/api/studios/${t.studio.id}/members/${t.owner.id}`, { role: 'designer' })
    expect(demote.status).toBe(409)
    expect(demote.body.message).toMatch(/needs an owner/)
    expect((await owner.delete(`/api/studios/${t.studio.id}/members/${t.owner.id}`)).status).toBe(409)

    expect((await owner.patch(`/api/studios/${t.studio.id}/members/${t.designer.id}`, { role: 'owner' })).status).toBe(200)
    expect((await owner.patch(`/api/studios/${t.studio.id}/members/${t.owner.id}`, { role: 'knitter' })).status).toBe(200)
    const me = await owner.get('/api/me')
    expect(me.body.studios.find((x: { id: number }) => x.id === t.studio.id).role).toBe('knitter')
  })

  it('a member may leave; a knitter may not remove someone else', async () => {
    const t = await makeStudio(1)
    const knitter = await signedIn(t.knitter.email, fixturePassword)
    expect((await knitter.delete(`/api/studios/${t.studio.id}/members/${t.spares[0]!.id}`)).status).toBe(403)
    expect((await knitter.delete(`/api/studios/${t.studio.id}/members/${t.knitter.id}`)).status).toBe(204)
    expect((await knitter.get(`/api/studios/${t.studio.id}/members`)).status).toBe(404)
  })

  it('rejects a role that does not exist and ids that are not ids', async () => {
    const owner = await signedIn(s.owner.email, fixturePassword)
    const bad = await owner.patch(`/api/studios/${s.studio.id}/members/${s.knitter.id}`, { role: 'admin' })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toContain('role')
    const notId = await owner.get('/api/studios/abc/members')
    expect(notId.status).toBe(400)
    expect(notId.body.message).toContain('studioId')
  })
})
