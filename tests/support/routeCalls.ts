import { createHash, randomBytes, randomUUID } from 'node:crypto'
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { signedIn, uniqueEmail, type ApiClient } from './api'
import { fixturePassword, makeProject, makeStock, makeUser, type makeStudio } from './db'
import { Invitation, Machine, Membership, Motif, Plan, PlanPiece, Swatch, UserSession, Yarn, type User } from '../../server/db/models'
import type { PlanSection } from '#shared/types/plan'
import { motifRecord } from '../../server/db/motifs'
import { chartPicture, pictureForm } from './pictures'
import { root } from './appServer'

/**
 * Every API route × every kind of caller → the status the server must answer.
 * A new route joins by adding a row; the last test fails while any route has none.
 */
export type Who = 'anonymous' | 'knitter' | 'designer' | 'owner' | 'outsider'
export const everyone: Who[] = ['anonymous', 'knitter', 'designer', 'owner', 'outsider']
export type Fixture = Awaited<ReturnType<typeof makeStudio>>
export interface Call { method: string; path: string; body?: unknown }
export interface Row {
  route: string
  call: (f: Fixture, who: Who, me?: User) => Call | Promise<Call>
  expect: Record<Who, number>
  /**
   * The call ends sessions: 'session' ends the caller's own (sign-out, sign-in), so it runs on a
   * sign-in of its own; 'person' ends the person's other sessions, so it runs as a new person
   * with the same role. Shared sessions of the test stay alive either way.
   */
  ends?: 'session' | 'person'
}

/** The client a row's call is sent with, for a caller (see Row.ends). */
export async function clientFor(f: Fixture, who: Who, row: Row, shared: () => ApiClient): Promise<{ client: ApiClient; me?: User }> {
  if (who === 'anonymous' || !row.ends) return { client: shared() }
  if (row.ends === 'session') return { client: await signedIn(f[who].email, fixturePassword), me: f[who] }
  const me = await makeUser(`matrix-${who}`)
  await Membership.create({ studioId: who === 'outsider' ? f.elsewhere.id : f.studio.id, userId: me.id, role: who === 'outsider' ? 'owner' : who })
  return { client: await signedIn(me.email, fixturePassword), me }
}

const same = (status: number): Record<Who, number> => ({ anonymous: status, knitter: status, designer: status, owner: status, outsider: status })
const signedInOnly = (status: number): Record<Who, number> => ({ ...same(status), anonymous: 401 })
const studioMember = (status: number): Record<Who, number> => ({ anonymous: 401, knitter: status, designer: status, owner: status, outsider: 404 })
const studioDesigner = (status: number): Record<Who, number> => ({ anonymous: 401, knitter: 403, designer: status, owner: status, outsider: 404 })
const studioOwner = (status: number): Record<Who, number> => ({ anonymous: 401, knitter: 403, designer: 403, owner: status, outsider: 404 })

/** A pending invitation of the studio, made in the database (no mail: the matrix and the
 * fuzz would otherwise run into the owner's invitation limit). Returns the link's token. */
async function freshInvitation(f: Fixture) {
  const token = randomBytes(32).toString('base64url')
  await Invitation.create({
    studioId: f.studio.id, email: uniqueEmail('matrix-invite'), role: 'knitter', invitedBy: f.owner.id,
    tokenHash: createHash('sha256').update(token).digest('hex'), expiresAt: new Date(Date.now() + 86_400_000),
  })
  return token
}

export function spareSession(user: User) {
  return UserSession.create({
    userId: user.id,
    sidHash: randomUUID().replaceAll('-', '').padEnd(64, '0'),
    device: 'Spare test device',
    address: '',
    lastSeenAt: new Date(),
  })
}

async function spareMember(f: Fixture) {
  const u = await makeUser('matrix-spare')
  await Membership.create({ studioId: f.studio.id, userId: u.id, role: 'knitter' })
  return u
}

export const roleMatrix: Row[] = [
  { route: 'GET /api/health', call: () => ({ method: 'GET', path: '/api/health' }), expect: same(200) },
  { route: 'GET /api/me', call: () => ({ method: 'GET', path: '/api/me' }), expect: signedInOnly(200) },
  {
    route: 'POST /api/auth/register',
    call: () => ({ method: 'POST', path: '/api/auth/register', body: { email: uniqueEmail('matrix'), password: 'matrix-password', name: 'M' } }),
    expect: same(201),
  },
  {
    route: 'POST /api/auth/login',
    call: f => ({ method: 'POST', path: '/api/auth/login', body: { email: f.knitter.email, password: fixturePassword } }),
    expect: same(200),
    ends: 'session',
  },
  { route: 'POST /api/auth/logout', call: () => ({ method: 'POST', path: '/api/auth/logout' }), expect: same(200), ends: 'session' },
  {
    route: 'POST /api/auth/confirm-address',
    call: () => ({ method: 'POST', path: '/api/auth/confirm-address', body: { token: 'x'.repeat(43) } }),
    expect: same(400),
  },
  { route: 'POST /api/me/confirmation-mail', call: () => ({ method: 'POST', path: '/api/me/confirmation-mail' }), expect: signedInOnly(409) },
  {
    route: 'POST /api/me/password',
    call: () => ({ method: 'POST', path: '/api/me/password', body: { current: fixturePassword, password: fixturePassword } }),
    expect: signedInOnly(200),
    ends: 'person',
  },
  { route: 'GET /api/me/sessions', call: () => ({ method: 'GET', path: '/api/me/sessions' }), expect: signedInOnly(200) },
  { route: 'DELETE /api/me/sessions', call: () => ({ method: 'DELETE', path: '/api/me/sessions' }), expect: signedInOnly(200), ends: 'person' },
  {
    // One of the caller's own devices (a session row of theirs that no client uses).
    route: 'DELETE /api/me/sessions/[id]',
    call: async (f, who, me) => ({ method: 'DELETE', path: `/api/me/sessions/${(await spareSession(me ?? (who === 'anonymous' ? f.knitter : f[who]))).id}` }),
    expect: signedInOnly(204),
  },
  {
    route: 'POST /api/auth/password-reset',
    call: () => ({ method: 'POST', path: '/api/auth/password-reset', body: { email: uniqueEmail('matrix') } }),
    expect: same(202),
  },
  {
    route: 'POST /api/auth/password-reset/confirm',
    call: () => ({ method: 'POST', path: '/api/auth/password-reset/confirm', body: { token: 'x'.repeat(43), password: 'matrix-password' } }),
    expect: same(400),
  },
  { route: 'GET /api/studios/[studioId]/members', call: f => ({ method: 'GET', path: `/api/studios/${f.studio.id}/members` }), expect: studioMember(200) },
  {
    route: 'GET /api/studios/[studioId]/production',
    call: f => ({ method: 'GET', path: `/api/studios/${f.studio.id}/production` }),
    expect: studioDesigner(200),
  },
  {
    route: 'POST /api/studios/[studioId]/invitations',
    call: f => ({ method: 'POST', path: `/api/studios/${f.studio.id}/invitations`, body: { email: uniqueEmail('matrix'), role: 'knitter' } }),
    expect: studioOwner(201),
  },
  {
    route: 'PATCH /api/studios/[studioId]/members/[userId]',
    call: async f => ({ method: 'PATCH', path: `/api/studios/${f.studio.id}/members/${(await spareMember(f)).id}`, body: { role: 'designer' } }),
    expect: studioOwner(200),
  },
  {
    route: 'DELETE /api/studios/[studioId]/members/[userId]',
    call: async f => ({ method: 'DELETE', path: `/api/studios/${f.studio.id}/members/${(await spareMember(f)).id}` }),
    expect: studioOwner(204),
  },
  { route: 'GET /api/motifs', call: f => ({ method: 'GET', path: `/api/motifs?studioId=${f.studio.id}` }), expect: studioMember(200) },
  {
    route: 'POST /api/motifs',
    call: f => ({ method: 'POST', path: '/api/motifs', body: { studioId: f.studio.id, name: 'Matrix motif', rows: ['x.', '.x'] } }),
    expect: studioDesigner(201),
  },
  // A published motif each time: knitters see it, so their edits are refused (403), not hidden (404).
  { route: 'GET /api/motifs/[id]', call: async f => ({ method: 'GET', path: `/api/motifs/${(await publishedMotif(f)).id}` }), expect: studioMember(200) },
  {
    route: 'PATCH /api/motifs/[id]',
    call: async f => ({ method: 'PATCH', path: `/api/motifs/${(await publishedMotif(f)).id}`, body: { name: 'Renamed', version: 0 } }),
    expect: studioDesigner(200),
  },
  {
    route: 'DELETE /api/motifs/[id]',
    call: async f => ({ method: 'DELETE', path: `/api/motifs/${(await publishedMotif(f)).id}` }),
    expect: studioDesigner(204),
  },
  {
    route: 'POST /api/motifs/[id]/duplicate',
    call: async f => ({ method: 'POST', path: `/api/motifs/${(await publishedMotif(f)).id}/duplicate` }),
    expect: studioDesigner(201),
  },
  {
    route: 'GET /api/motifs/[id]/export',
    call: async f => ({ method: 'GET', path: `/api/motifs/${(await publishedMotif(f)).id}/export?format=csv` }),
    expect: studioMember(200),
  },
  {
    route: 'GET /api/motifs/[id]/picture',
    call: async f => ({ method: 'GET', path: `/api/motifs/${await publishedPictureMotif(f)}/picture` }),
    expect: studioMember(200),
  },
  {
    route: 'POST /api/motifs/import',
    call: f => ({ method: 'POST', path: '/api/motifs/import', body: { studioId: f.studio.id, format: 'csv', content: '0,1\n1,0\n' } }),
    expect: studioDesigner(201),
  },
  {
    route: 'POST /api/motifs/from-picture',
    call: f => ({
      method: 'POST',
      path: '/api/motifs/from-picture',
      body: pictureForm({ studioId: f.studio.id, name: 'Matrix picture', width: 2, height: 2 }, chartPicture(['x.', '.x'])),
    }),
    expect: studioDesigner(201),
  },
  {
    route: 'POST /api/motifs/picture-preview',
    call: f => ({
      method: 'POST',
      path: '/api/motifs/picture-preview',
      body: pictureForm({ studioId: f.studio.id, width: 2, height: 2 }, chartPicture(['x.', '.x'])),
    }),
    expect: studioDesigner(200),
  },
  { route: 'GET /api/yarns', call: f => ({ method: 'GET', path: `/api/yarns?studioId=${f.studio.id}` }), expect: studioMember(200) },
  { route: 'POST /api/yarns', call: f => ({ method: 'POST', path: '/api/yarns', body: planner.yarnBody(f) }), expect: studioDesigner(201) },
  {
    route: 'PATCH /api/yarns/[id]',
    call: async f => ({ method: 'PATCH', path: `/api/yarns/${(await planner.yarn(f)).id}`, body: { gramsOnHand: 250 } }),
    expect: studioDesigner(200),
  },
  // Machines and yarns are the studio's stock: only the owner deletes them.
  { route: 'DELETE /api/yarns/[id]', call: async f => ({ method: 'DELETE', path: `/api/yarns/${(await planner.yarn(f)).id}` }), expect: studioOwner(204) },
  { route: 'GET /api/machines', call: f => ({ method: 'GET', path: `/api/machines?studioId=${f.studio.id}` }), expect: studioMember(200) },
  { route: 'POST /api/machines', call: f => ({ method: 'POST', path: '/api/machines', body: planner.machineBody(f) }), expect: studioDesigner(201) },
  {
    route: 'PATCH /api/machines/[id]',
    call: async f => ({ method: 'PATCH', path: `/api/machines/${(await planner.machine(f)).id}`, body: { notes: 'Matrix' } }),
    expect: studioDesigner(200),
  },
  {
    route: 'DELETE /api/machines/[id]',
    call: async f => ({ method: 'DELETE', path: `/api/machines/${(await planner.machine(f)).id}` }),
    expect: studioOwner(204),
  },
  { route: 'GET /api/swatches', call: f => ({ method: 'GET', path: `/api/swatches?studioId=${f.studio.id}` }), expect: studioMember(200) },
  { route: 'POST /api/swatches', call: f => ({ method: 'POST', path: '/api/swatches', body: planner.swatchBody(f) }), expect: studioDesigner(201) },
  { route: 'GET /api/swatches/[id]', call: async f => ({ method: 'GET', path: `/api/swatches/${(await planner.swatch(f)).id}` }), expect: studioMember(200) },
  {
    route: 'PATCH /api/swatches/[id]',
    call: async f => ({ method: 'PATCH', path: `/api/swatches/${(await planner.swatch(f)).id}`, body: { washed: true } }),
    expect: studioDesigner(200),
  },
  {
    route: 'DELETE /api/swatches/[id]',
    call: async f => ({ method: 'DELETE', path: `/api/swatches/${(await planner.swatch(f)).id}` }),
    expect: studioDesigner(204),
  },
  { route: 'GET /api/plans', call: f => ({ method: 'GET', path: `/api/plans?studioId=${f.studio.id}` }), expect: studioMember(200) },
  { route: 'POST /api/plans', call: async f => ({ method: 'POST', path: '/api/plans', body: await planner.planBody(f) }), expect: studioDesigner(201) },
  // A published plan each time: knitters see it, so their edits are refused (403), not hidden (404).
  { route: 'GET /api/plans/[id]', call: async f => ({ method: 'GET', path: `/api/plans/${await planner.publishedPlan(f)}` }), expect: studioMember(200) },
  {
    route: 'PATCH /api/plans/[id]',
    call: async f => ({ method: 'PATCH', path: `/api/plans/${await planner.publishedPlan(f)}`, body: { name: 'Renamed plan', version: 0 } }),
    expect: studioDesigner(200),
  },
  {
    route: 'DELETE /api/plans/[id]',
    call: async f => ({ method: 'DELETE', path: `/api/plans/${await planner.publishedPlan(f)}` }),
    expect: studioDesigner(204),
  },
  {
    route: 'POST /api/plans/[id]/share',
    call: async f => ({ method: 'POST', path: `/api/plans/${await planner.publishedPlan(f)}/share`, body: { email: uniqueEmail('matrix-share') } }),
    expect: studioDesigner(201),
  },
  {
    route: 'POST /api/plans/[id]/projects',
    call: async f => ({ method: 'POST', path: `/api/plans/${await planner.publishedPlan(f)}/projects`, body: {} }),
    expect: studioMember(201),
  },
  { route: 'GET /api/invitations/[token]', call: async f => ({ method: 'GET', path: `/api/invitations/${await freshInvitation(f)}` }), expect: same(200) },
  {
    // The link is the secret; an address with no account gets one on accepting.
    route: 'POST /api/invitations/[token]/accept',
    call: async f => ({ method: 'POST', path: `/api/invitations/${await freshInvitation(f)}/accept`, body: { name: 'Matrix', password: 'matrix-password' } }),
    expect: same(200),
    ends: 'session', // accepting signs in as the new account, ending the caller's session here
  },
  { route: 'GET /api/projects', call: () => ({ method: 'GET', path: '/api/projects' }), expect: signedInOnly(200) },
  {
    // The knitter's own project: designers and owners of the studio see it too.
    route: 'GET /api/projects/[id]',
    call: async f => ({ method: 'GET', path: `/api/projects/${(await knittersProject(f)).project.id}` }),
    expect: studioMember(200),
  },
  {
    route: 'POST /api/projects',
    call: async f => ({ method: 'POST', path: '/api/projects', body: await newProjectForm(f) }),
    expect: studioMember(201),
  },
  { route: 'GET /api/pieces', call: () => ({ method: 'GET', path: '/api/pieces' }), expect: signedInOnly(200) },
  {
    route: 'GET /api/pieces/[id]',
    call: async f => ({ method: 'GET', path: `/api/pieces/${(await knittersProject(f)).pieces[0]!.id}` }),
    expect: studioMember(200),
  },
  {
    route: 'GET /api/pieces/[id]/progress',
    call: async f => ({ method: 'GET', path: `/api/pieces/${(await knittersProject(f)).pieces[0]!.id}/progress` }),
    expect: studioMember(200),
  },
  {
    // Anyone signed in may sync; a step on a piece that is not theirs comes back in `rejected`.
    route: 'POST /api/sync',
    call: async f => ({
      method: 'POST',
      path: '/api/sync',
      body: {
        deviceId: 'matrix-device',
        events: [
          { id: randomUUID(), pieceId: (await knittersProject(f)).pieces[0]!.id, kind: 'advance', from: 0, to: 1, version: 0, at: new Date().toISOString() },
        ],
      },
    }),
    expect: signedInOnly(200),
  },
]

function publishedMotif(f: Fixture) {
  return Motif.create({ studioId: f.studio.id, name: 'Matrix published', published: true, createdBy: null, updatedBy: null, ...motifRecord(['x..', '.x.']) })
}

// Made once through the API (the designer uploads, then publishes), then read by everyone.
let pictureMotifId: number | undefined
async function publishedPictureMotif(f: Fixture) {
  if (pictureMotifId) return pictureMotifId
  const designer = await signedIn(f.designer.email, fixturePassword)
  const made = await designer.post(
    '/api/motifs/from-picture',
    pictureForm({ studioId: f.studio.id, name: 'Matrix picture', width: 2, height: 2 }, chartPicture(['x.', '.x'])),
  )
  await designer.patch(`/api/motifs/${made.body.id}`, { published: true })
  pictureMotifId = made.body.id as number
  return pictureMotifId
}

function knittersProject(f: Fixture) {
  return makeProject({ studioId: f.studio.id, knitterId: f.knitter.id, pieces: ['Back'] })
}

let stock: Awaited<ReturnType<typeof makeStock>> | undefined
async function newProjectForm(f: Fixture) {
  stock ??= await makeStock(f.studio.id)
  return {
    studioId: f.studio.id, name: 'Matrix jumper', motifId: stock.motif.id, borderBefore: 4, borderAfter: 2, chartRows: 8,
    needles: 60, technique: 'together', mainYarnId: stock.main.id, contrastYarnId: stock.contrast.id, pieces: [{ name: 'Back' }],
  }
}

// Planner fixtures through the models (the routes under test are called by the rows).
const planner = {
  yarnBody: (f: Fixture) => ({ studioId: f.studio.id, name: 'Matrix yarn', hex: '#335577', weightCategory: 1, metresPer100g: 400 }),
  yarn: (f: Fixture) => Yarn.create({ studioId: f.studio.id, name: 'Matrix yarn', hex: '#335577', weightCategory: 1, metresPer100g: 400 }),
  machineBody: (f: Fixture) => ({ studioId: f.studio.id, name: 'Matrix machine', needlePitchMm: 4.5, needles: 200, patterningWidth: 24 }),
  machine: (f: Fixture) => Machine.create({ studioId: f.studio.id, name: 'Matrix machine', needlePitchMm: 4.5, needles: 200, patterningWidth: 24 }),
  swatchBody: (f: Fixture) => ({ studioId: f.studio.id, stitches: 30, rows: 40, width: 10, height: 10, unit: 'cm', grams: 6 }),
  swatch: (f: Fixture) =>
    Swatch.create({
      studioId: f.studio.id,
      machineId: null,
      mainYarnId: null,
      contrastYarnId: null,
      stitches: 30,
      rows: 40,
      width: 10,
      height: 10,
      unit: 'cm',
      grams: 6,
    }),
  async planBody(f: Fixture) {
    stock ??= await makeStock(f.studio.id)
    const [machine, swatch] = [await planner.machine(f), await planner.swatch(f)]
    return {
      studioId: f.studio.id,
      name: 'Matrix plan',
      machineId: machine.id,
      swatchId: swatch.id,
      yarns: [
        { slot: 'A', yarnId: stock.main.id },
        { slot: 'B', yarnId: stock.contrast.id },
      ],
      pieces: [
        {
          name: 'Back',
          targetWidth: 20,
          targetLength: 10,
          sections: [
            { kind: 'plain', rows: 4, yarn: 'A' },
            { kind: 'motif', motifId: stock.motif.id, placement: 'centred', chartRows: 8, main: 'A', contrast: 'B' },
          ],
        },
      ],
    }
  },
  async publishedPlan(f: Fixture) {
    const { studioId, pieces, ...fields } = await planner.planBody(f)
    const plan = await Plan.create({ studioId, ...fields, published: true, createdBy: f.designer.id, updatedBy: f.designer.id })
    for (const [i, p] of pieces.entries()) {
      await PlanPiece.create({ planId: plan.id, position: i + 1, copies: 1, unit: 'cm', ease: 0, ...p, sections: p.sections as PlanSection[] })
    }
    return plan.id
  },
}

/** Every route file under server/api as "METHOD /api/path" (the names the tables use). */
export function apiRoutes() {
  const apiDir = join(root, 'server/api')
  const files: string[] = []
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name)
      if (statSync(path).isDirectory()) walk(path)
      else if (name !== '[...].ts') files.push(relative(apiDir, path))
    }
  }
  walk(apiDir)
  return files.map((file) => {
    const [, path, method] = file.match(/^(.*?)\.(get|post|patch|put|delete)\.ts$/) ?? []
    if (!method) return `unnamed method: ${file}`
    return `${method.toUpperCase()} /api/${path!.replace(/(^|\/)index$/, '')}`.replace(/\/$/, '')
  })
}
