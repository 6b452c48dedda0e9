import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeProject, makeStudio } from '../support/db'
import { Project } from '../../server/db/models'

// What one member learns about the studio's other work and people: a knitter knits from a
// published plan without learning the names of library motifs still in draft, and only
// owners see members' e-mail addresses.

let s: Awaited<ReturnType<typeof makeStudio>>
const as = {} as Record<'knitter' | 'designer' | 'owner', ApiClient>
beforeAll(async () => {
  s = await makeStudio()
  for (const who of ['knitter', 'designer', 'owner'] as const) as[who] = await signedIn(s[who].email, fixturePassword)
})
afterAll(closeTestDb)

async function made(res: Promise<{ status: number; body: any }>, status = 201) {
  const r = await res
  expect(r.status, JSON.stringify(r.body)).toBe(status)
  return r.body
}

describe('a published plan that uses a draft motif', () => {
  const secret = 'Unreleased autumn medallion'
  let plan: any
  beforeAll(async () => {
    const studioId = s.studio.id
    const machine = await made(as.designer.post('/api/machines', { studioId, name: 'Bed', needlePitchMm: 4.5, needles: 200, patterningWidth: 24 }))
    const swatch = await made(as.designer.post('/api/swatches', { studioId, stitches: 30, rows: 40, width: 10, height: 10, unit: 'cm', grams: 8 }))
    const yarn = (name: string, hex: string) =>
      made(as.designer.post('/api/yarns', { studioId, name, hex, weightCategory: 1, metresPer100g: 400, gramsOnHand: 500 }))
    const [oat, navy] = [await yarn('Oat', '#e8dcc0'), await yarn('Navy', '#1c2a4a')]
    const draft = await made(as.designer.post('/api/motifs', { studioId, name: secret, rows: ['xx..', '..xx'] }))
    const open = await made(as.designer.post('/api/motifs', { studioId, name: 'Open stripes', rows: ['x.', '..'], published: true }))
    const motif = (motifId: number, label?: string) => ({
      kind: 'motif',
      motifId,
      placement: 'centred',
      chartRows: 2,
      main: 'A',
      contrast: 'B',
      ...(label ? { label } : {}),
    })
    plan = await made(as.designer.post('/api/plans', {
      studioId, name: 'Autumn jumper', machineId: machine.id, swatchId: swatch.id, published: true,
      yarns: [{ slot: 'A', yarnId: oat.id }, { slot: 'B', yarnId: navy.id }],
      pieces: [{ name: 'Front', targetWidth: 20, targetLength: 10, sections: [
        { kind: 'plain', rows: 4, yarn: 'A' }, motif(draft.id), motif(draft.id, 'Yoke band'), motif(open.id),
      ] }],
    }))
  })

  const motifSections = (timeline: any) => timeline.sections.filter((x: any) => x.kind === 'motif')
    .map((x: any) => ({ label: x.label, motifName: x.motifName, chart: x.chart }))
  // The draft's chart is what the knitter knits; only its name stays in the library.
  const forKnitters = [
    { label: 'Motif', motifName: 'Motif', chart: ['xx..', '..xx'] },
    { label: 'Yoke band', motifName: 'Yoke band', chart: ['xx..', '..xx'] },
    { label: 'Open stripes', motifName: 'Open stripes', chart: ['x.', '..'] },
  ]

  it('shows a knitter the draft\'s chart under the section\'s own label or "Motif", never its name', async () => {
    const seen = await made(as.knitter.get(`/api/plans/${plan.id}`), 200)
    expect(JSON.stringify(seen)).not.toContain(secret)
    expect(motifSections(seen.pieces[0].numbers.preview.timeline)).toEqual(forKnitters)
  })

  it('still shows designers and owners the draft\'s name', async () => {
    for (const who of ['designer', 'owner'] as const) {
      const seen = await made(as[who].get(`/api/plans/${plan.id}`), 200)
      expect(motifSections(seen.pieces[0].numbers.preview.timeline).map((x: any) => x.label)).toEqual([secret, 'Yoke band', 'Open stripes'])
    }
  })

  it('freezes no draft name into the project a knitter starts, nor into its pieces', async () => {
    const project = await made(as.knitter.post(`/api/plans/${plan.id}/projects`, {}))
    const piece = await made(as.knitter.get(`/api/pieces/${project.pieces[0].id}`), 200)
    expect(motifSections(piece.timeline)).toEqual(forKnitters)
    for (const path of [`/api/projects/${project.id}`, '/api/projects', '/api/pieces']) {
      expect(JSON.stringify(await made(as.knitter.get(path), 200)), path).not.toContain(secret)
    }
    const stored = await Project.findByPk(project.id)
    expect(JSON.stringify(stored!.planSnapshot)).not.toContain(secret)
  })
})

describe('members\' e-mail addresses', () => {
  const others = (me: { id: number }) => [s.owner, s.designer, s.knitter].filter(u => u.id !== me.id)

  it('owners see every member\'s e-mail', async () => {
    const { members } = await made(as.owner.get(`/api/studios/${s.studio.id}/members`), 200)
    expect(members.map((m: any) => [m.name, m.email]).sort()).toEqual([s.owner, s.designer, s.knitter].map(u => [u.name, u.email]).sort())
  })

  it.each(['designer', 'knitter'] as const)('a %s sees names and roles, no e-mail', async (who) => {
    const { members } = await made(as[who].get(`/api/studios/${s.studio.id}/members`), 200)
    expect(members.map((m: any) => [m.name, m.role]).sort()).toEqual(
      [
        [s.owner.name, 'owner'],
        [s.designer.name, 'designer'],
        [s.knitter.name, 'knitter'],
      ].sort(),
    )
    for (const m of members) expect(m).not.toHaveProperty('email')
  })

  it.each(['designer', 'knitter'] as const)('no answer a %s reads about the studio carries another member\'s e-mail', async (who) => {
    await makeProject({ studioId: s.studio.id, knitterId: s.knitter.id, name: 'Someone knits' })
    const paths = [
      `/api/studios/${s.studio.id}/members`, '/api/projects', '/api/pieces', `/api/plans?studioId=${s.studio.id}`, `/api/motifs?studioId=${s.studio.id}`,
      ...(who === 'designer' ? [`/api/studios/${s.studio.id}/production`] : []),
    ]
    for (const path of paths) {
      const text = JSON.stringify(await made(as[who].get(path), 200))
      for (const u of others(s[who])) expect(text, path).not.toContain(u.email)
    }
  })
})
