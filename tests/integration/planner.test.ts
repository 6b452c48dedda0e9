import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'

// The planner through the API: stock CRUD by role, the handbook examples end to end, a yarn
// estimate worked by hand, and projects that keep a snapshot of the plan they started from.

let s: Awaited<ReturnType<typeof makeStudio>>
const as = {} as Record<'knitter' | 'designer' | 'owner' | 'outsider', ApiClient>
beforeAll(async () => {
  s = await makeStudio()
  for (const who of ['knitter', 'designer', 'owner', 'outsider'] as const) as[who] = await signedIn(s[who].email, fixturePassword)
})
afterAll(closeTestDb)

async function made(res: Promise<{ status: number; body: any }>, status = 201) {
  const r = await res
  expect(r.status, JSON.stringify(r.body)).toBe(status)
  return r.body
}

const machine = (overrides: Record<string, unknown> = {}) => ({
  studioId: s.studio.id,
  name: 'Standard gauge',
  needlePitchMm: 4.5,
  needles: 200,
  patterningWidth: 24,
  ...overrides,
})
const yarn = (overrides: Record<string, unknown> = {}) => ({
  studioId: s.studio.id,
  name: 'Oat 4-ply',
  hex: '#E8DCC0',
  weightCategory: 1,
  metresPer100g: 400,
  gramsOnHand: 100,
  ...overrides,
})

describe('machines and yarn stock', () => {
  it('designers add and change, any member reads, only the owner deletes, other studios see nothing', async () => {
    const m = await made(as.designer.post('/api/machines', machine()))
    expect(m).toMatchObject({
      name: 'Standard gauge',
      needlePitchMm: 4.5,
      needles: 200,
      patterningWidth: 24,
      technique: 'together',
      passesPerColour: 2,
      notes: '',
    })
    expect((await as.knitter.post('/api/machines', machine())).status).toBe(403)
    expect((await as.knitter.get(`/api/machines?studioId=${s.studio.id}`)).body.map((x: any) => x.id)).toContain(m.id)
    expect(await made(as.designer.patch(`/api/machines/${m.id}`, { technique: 'colour-by-colour', needlePitchMm: 9 }), 200)).toMatchObject({
      technique: 'colour-by-colour',
      needlePitchMm: 9,
    })
    expect((await as.outsider.patch(`/api/machines/${m.id}`, { name: 'Mine now' })).status).toBe(404)
    expect((await as.designer.delete(`/api/machines/${m.id}`)).status).toBe(403)
    expect((await as.owner.delete(`/api/machines/${m.id}`)).status).toBe(204)
    expect((await as.owner.patch(`/api/machines/${m.id}`, { name: 'Gone' })).status).toBe(404)

    const y = await made(as.designer.post('/api/yarns', yarn()))
    // The colour is kept lower-case; the weight category carries its Craft Yarn Council name.
    expect(y).toMatchObject({ name: 'Oat 4-ply', hex: '#e8dcc0', weightCategory: 1, weightName: 'Super Fine', metresPer100g: 400, gramsOnHand: 100, notes: '' })
    expect((await made(as.designer.patch(`/api/yarns/${y.id}`, { gramsOnHand: 42.5 }), 200)).gramsOnHand).toBe(42.5)
    const list = (await as.knitter.get(`/api/yarns?studioId=${s.studio.id}`)).body
    // The list keeps the fields it always had (YarnListItem).
    expect(list.find((x: any) => x.id === y.id)).toMatchObject({
      id: y.id,
      name: 'Oat 4-ply',
      hex: '#e8dcc0',
      weightCategory: 1,
      metresPer100g: 400,
      gramsOnHand: 42.5,
    })
    expect((await as.outsider.get(`/api/yarns?studioId=${s.studio.id}`)).status).toBe(404)
    expect((await as.knitter.delete(`/api/yarns/${y.id}`)).status).toBe(403)
    expect((await as.owner.delete(`/api/yarns/${y.id}`)).status).toBe(204)
  })

  it.each([
    ['/api/machines', () => machine({ needles: 0 }), 'needles'],
    ['/api/machines', () => machine({ needlePitchMm: -1 }), 'needlePitchMm'],
    ['/api/machines', () => machine({ patterningWidth: 201 }), 'patterningWidth'],
    ['/api/yarns', () => yarn({ hex: 'navy' }), 'hex'],
    ['/api/yarns', () => yarn({ weightCategory: 8 }), 'weightCategory'],
    ['/api/yarns', () => yarn({ metresPer100g: 0 }), 'metresPer100g'],
    ['/api/swatches', () => ({ studioId: 0 }), 'studioId'],
  ])('POST %s names the bad field (case %#)', async (path, body, field) => {
    const res = await as.designer.post(path, body())
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(`${field}:`)
    expect(res.body.data.issues.map((i: any) => i.path.join('.'))).toContain(field)
  })
})

describe('swatches', () => {
  it('answer with the gauge per 10 cm and per 4 in and the weight category', async () => {
    // "18 sts and 24 rows to 4 in" is 4.5 stitches per inch — Australian Knitting,
    // "Knitting and the Magic Formula" (published). Medium (4) holds 16–20 sts per 4 in — Craft
    // Yarn Council, Standard Yarn Weight System (published).
    const sw = await made(
      as.designer.post('/api/swatches', {
        studioId: s.studio.id,
        stitchSize: 'dial 6 and a bit',
        stitches: 18,
        rows: 24,
        width: 4,
        height: 4,
        unit: 'in',
        grams: 12,
        washed: true,
      }),
    )
    expect(sw).toMatchObject({ stitchSize: 'dial 6 and a bit', stitches: 18, rows: 24, width: 4, height: 4, unit: 'in', grams: 12, washed: true })
    expect(sw.gauge.stitchesPer4in).toBeCloseTo(18, 9)
    expect(sw.gauge.rowsPer4in).toBeCloseTo(24, 9)
    expect(sw.gauge.stitchesPer4in / 4).toBeCloseTo(4.5, 9)
    // 4 in is 10.16 cm: per 10 cm is 1.6 % fewer (NIST SP 811: 1 in = 2.54 cm exactly).
    expect(sw.gauge.stitchesPer10cm).toBeCloseTo(18 / 1.016, 9)
    expect(sw.gauge.stitchWidthMm).toBeCloseTo(101.6 / 18, 9)
    expect(sw.gauge.rowHeightMm).toBeCloseTo(101.6 / 24, 9)
    expect(sw.gauge.weightCategory).toEqual({ category: 4, name: 'Medium', alsoFits: [] })

    expect((await as.knitter.get(`/api/swatches/${sw.id}`)).body.gauge.stitchesPer4in).toBeCloseTo(18, 9)
    expect((await as.knitter.patch(`/api/swatches/${sw.id}`, { washed: false })).status).toBe(403)
    expect((await as.outsider.get(`/api/swatches/${sw.id}`)).status).toBe(404)
    const moved = await made(as.designer.patch(`/api/swatches/${sw.id}`, { width: 10, height: 10, unit: 'cm', stitches: 30, rows: 40 }), 200)
    expect(moved.gauge).toMatchObject({ stitchesPer10cm: 30, rowsPer10cm: 40 })
    expect((await as.designer.get(`/api/swatches?studioId=${s.studio.id}`)).body.map((x: any) => x.id)).toContain(sw.id)
    expect((await as.designer.delete(`/api/swatches/${sw.id}`)).status).toBe(204)
  })

  it('refuses a machine or yarn of another studio, naming the field', async () => {
    const theirs = await made(as.outsider.post('/api/yarns', { ...yarn(), studioId: s.elsewhere.id }))
    const res = await as.designer.post('/api/swatches', {
      studioId: s.studio.id,
      stitches: 30,
      rows: 40,
      width: 10,
      height: 10,
      unit: 'cm',
      mainYarnId: theirs.id,
    })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toEqual(['mainYarnId'])
    const unit = await as.designer.post('/api/swatches', { studioId: s.studio.id, stitches: 30, rows: 40, width: 10, height: 10, unit: 'mm' })
    expect(unit.body.data.issues.map((i: any) => i.path.join('.'))).toEqual(['unit'])
  })
})

describe('plans', () => {
  let stock: { machine: any; swatch: any; oat: any; navy: any; motif: any }
  beforeAll(async () => {
    stock = {
      machine: await made(as.designer.post('/api/machines', machine({ name: 'Plan machine' }))),
      // 22 sts over 10.16 cm (5.5 sts/in) and 40 rows over 10 cm.
      swatch: await made(as.designer.post('/api/swatches', { studioId: s.studio.id, stitches: 22, rows: 40, width: 10.16, height: 10, unit: 'cm', grams: 8 })),
      oat: await made(as.designer.post('/api/yarns', yarn({ name: 'Oat' }))),
      navy: await made(as.designer.post('/api/yarns', yarn({ name: 'Navy', hex: '#1c2a4a', metresPer100g: 200 }))),
      motif: await made(as.designer.post('/api/motifs', { studioId: s.studio.id, name: 'Checks', rows: ['x.', '.x'] })),
    }
  })

  function handbookPlan(overrides: Record<string, unknown> = {}) {
    return {
      studioId: s.studio.id, name: 'Handbook jumper', machineId: stock.machine.id, swatchId: stock.swatch.id,
      yarns: [{ slot: 'A', yarnId: stock.oat.id }, { slot: 'B', yarnId: stock.navy.id }],
      pieces: [{
        name: 'Sleeve', copies: 2, targetWidth: 9, targetLength: 49 / 2.54, unit: 'in', sections: [
          { kind: 'cast-on-note', text: 'Cast on with waste yarn' },
          { kind: 'plain', lengthCm: 49, yarn: 'A', stitchSize: '6' },
          { kind: 'shaping', change: 'increase', stitchesEachSide: 36, rows: 140 },
          { kind: 'motif', motifId: stock.motif.id, placement: 'centred', chartRows: 4, main: 'A', contrast: 'B' },
          { kind: 'cast-off-note', text: 'Cast off loosely' },
        ],
      }],
      ...overrides,
    }
  }

  it('works the handbook examples out through the API', async () => {
    const plan = await made(as.designer.post('/api/plans', handbookPlan()))
    const n = plan.pieces[0].numbers
    // 9 in at 5.5 sts/in → 49.5 → 50 stitches — Australian Knitting, "Knitting and the Magic Formula" (published).
    expect(n.needles).toBe(50)
    // 49 cm at 40 rows per 10 cm → 196 rows — same source (published).
    expect(n.sections[1]).toMatchObject({ kind: 'plain', rows: 196 })
    expect(n.targetRows).toBe(196)
    // 36 shaping steps over 140 rows → every 3rd row ×4, every 4th row ×32 — same source (published).
    expect(n.sections[2].shaping).toEqual({
      steps: [
        { every: 3, times: 4 },
        { every: 4, times: 32 },
      ],
      text: 'every 3rd row ×4, every 4th row ×32',
      stitchesAfter: 50 + 72,
    })
    // A 2-stitch motif centred on 50 needles: 25 whole repeats, nothing left over.
    expect(n.sections[3].placement).toEqual({ offset: 0, chartWidth: 2, fullRepeats: 25, leftoverLeft: 0, leftoverRight: 0 })
    expect(n.sections[3].maxFloat).toEqual([1, 1])
    // Notes take no rows; together, one machine row per row.
    expect(n.sections.map((x: any) => x.rows)).toEqual([0, 196, 140, 4, 0])
    expect(n.plannedRows).toBe(340)
    expect(n.machineRows).toBe(340)
    // 22 sts per 4 in: Light (21–24) — Craft Yarn Council, Standard Yarn Weight System (published).
    expect(plan.gauge.weightCategory.name).toBe('Light')
    expect(plan.warnings.filter((w: any) => w.kind === 'long-floats' || w.kind === 'needles-over-bed')).toEqual([])
  })

  it('warns about long floats, close colours and a bed too narrow', async () => {
    const wide = await made(as.designer.post('/api/motifs', { studioId: s.studio.id, name: 'Long floats', rows: ['x.........'] }))
    const grey = await made(as.designer.post('/api/yarns', yarn({ name: 'Oat twin', hex: '#e6dac0' })))
    const small = await made(as.designer.post('/api/machines', machine({ name: 'Small bed', needles: 40, patterningWidth: 8 })))
    const plan = await made(
      as.designer.post(
        '/api/plans',
        handbookPlan({
          machineId: small.id,
          floatLimit: 3,
          yarns: [
            { slot: 'A', yarnId: stock.oat.id },
            { slot: 'B', yarnId: grey.id },
          ],
          pieces: [
            {
              name: 'Panel',
              targetWidth: 9,
              targetLength: 10,
              unit: 'in',
              sections: [{ kind: 'motif', motifId: wide.id, placement: { offset: 3 }, chartRows: 2, main: 'A', contrast: 'B' }],
            },
          ],
        }),
      ),
    )
    const kinds = plan.warnings.map((w: any) => w.kind)
    expect(kinds).toEqual(expect.arrayContaining(['long-floats', 'colours-close', 'needles-over-bed', 'repeat-over-patterning-width']))
    expect(plan.contrast[0]).toMatchObject({ slots: ['A', 'B'], verdict: 'hard' })
    expect(plan.pieces[0].numbers.sections[0].placement).toMatchObject({ offset: 3, chartWidth: 10 })
  })

  it('estimates yarn per colour against stock (worked by hand)', async () => {
    // Swatch 10 sts × 10 rows over 10 × 10 cm weighing 2 g → 0.02 g a stitch; 10 cm wide → 10 needles.
    // Plain 4 rows in A: 40 sts. Motif ['x.', '.x'] 2 chart rows together: 10 main + 10 contrast sts;
    // A floats past 10 needles, B past 10, each 4.5 mm → 45 mm.
    // A: 50 sts × 0.02 = 1.0 g + 0.045 m at 400 m/100 g = 0.01125 g → 1.01125 g, × 4 m/g = 4.045 m.
    // B: 10 sts × 0.02 = 0.2 g + 0.045 m at 200 m/100 g = 0.0225 g → 0.2225 g, × 2 m/g = 0.445 m.
    // Two copies: A 2.0225 g / 8.09 m, B 0.445 g / 0.89 m. B has 0.4 g on hand → low.
    const swatch = await made(as.designer.post('/api/swatches', { studioId: s.studio.id, stitches: 10, rows: 10, width: 10, height: 10, unit: 'cm', grams: 2 }))
    const scrap = await made(as.designer.post('/api/yarns', yarn({ name: 'Navy scrap', hex: '#1c2a4a', metresPer100g: 200, gramsOnHand: 0.4 })))
    const plan = await made(as.designer.post('/api/plans', handbookPlan({
      swatchId: swatch.id, yarns: [{ slot: 'A', yarnId: stock.oat.id }, { slot: 'B', yarnId: scrap.id }],
      pieces: [{ name: 'Pocket', copies: 2, targetWidth: 10, targetLength: 6, sections: [
        { kind: 'plain', rows: 4, yarn: 'A' },
        { kind: 'motif', motifId: stock.motif.id, placement: 'centred', chartRows: 2, main: 'A', contrast: 'B' },
      ] }],
    })))
    expect(plan.pieces[0].numbers.needles).toBe(10)
    const [a, b] = plan.estimate.yarns
    expect(a).toMatchObject({ slot: 'A', yarnId: stock.oat.id, low: false, gramsOnHand: 100 })
    expect(a.grams).toBeCloseTo(2.0225, 9)
    expect(a.metres).toBeCloseTo(8.09, 9)
    expect(a.floatGrams).toBeCloseTo(0.0225, 9)
    expect(b).toMatchObject({ slot: 'B', yarnId: scrap.id, low: true, gramsOnHand: 0.4 })
    expect(b.grams).toBeCloseTo(0.445, 9)
    expect(b.metres).toBeCloseTo(0.89, 9)
    expect(plan.estimate.model).toContain('swatch stitch')
    expect(plan.warnings.map((w: any) => w.kind)).toContain('low-stock')

    // The stock list marks a yarn short only against published plans: a draft counts for nothing.
    const listed = async () => (await as.knitter.get(`/api/yarns?studioId=${s.studio.id}`)).body.find((x: any) => x.id === scrap.id)
    expect(await listed()).toMatchObject({ plannedGrams: 0, plannedIn: 0, low: false })
    await made(as.designer.patch(`/api/plans/${plan.id}`, { published: true }), 200)
    const short = await listed()
    expect(short).toMatchObject({ plannedIn: 1, low: true })
    expect(short.plannedGrams).toBeCloseTo(0.445, 9)
    await made(as.designer.patch(`/api/yarns/${scrap.id}`, { gramsOnHand: 1 }), 200)
    expect(await listed()).toMatchObject({ plannedIn: 1, low: false })
  })

  it('keeps the stock list\'s planned grams true to every change the estimate reads', async () => {
    // The answer is kept between calls (server/utils/plannedYarn.ts); each change below must show.
    // Same pocket as above, one copy: B needs 0.2225 g with a 2 g swatch.
    const swatch = await made(as.designer.post('/api/swatches', { studioId: s.studio.id, stitches: 10, rows: 10, width: 10, height: 10, unit: 'cm', grams: 2 }))
    const scrap = await made(as.designer.post('/api/yarns', yarn({ name: 'Kept scrap', hex: '#2a1c4a', metresPer100g: 200, gramsOnHand: 5 })))
    const pocket = (rows: number) => [{ name: 'Pocket', copies: 1, targetWidth: 10, targetLength: 6, sections: [
      { kind: 'plain', rows, yarn: 'A' },
      { kind: 'motif', motifId: stock.motif.id, placement: 'centred', chartRows: 2, main: 'A', contrast: 'B' },
    ] }]
    const plan = await made(
      as.designer.post(
        '/api/plans',
        handbookPlan({
          swatchId: swatch.id,
          yarns: [
            { slot: 'A', yarnId: stock.oat.id },
            { slot: 'B', yarnId: scrap.id },
          ],
          pieces: pocket(4),
        }),
      ),
    )
    await made(as.designer.patch(`/api/plans/${plan.id}`, { published: true }), 200)
    const planned = async () => (await as.knitter.get(`/api/yarns?studioId=${s.studio.id}`)).body.find((x: any) => x.id === scrap.id)
    expect((await planned()).plannedGrams).toBeCloseTo(0.2225, 9)
    expect((await planned()).plannedGrams).toBeCloseTo(0.2225, 9) // kept: the same answer
    // The swatch weighed twice as much: every stitch weighs twice as much → 0.2 × 2 + 0.0225 (floats by length).
    await made(as.designer.patch(`/api/swatches/${swatch.id}`, { grams: 4 }), 200)
    expect((await planned()).plannedGrams).toBeCloseTo(0.4225, 9)
    // Two copies of the piece: twice the grams.
    await made(as.designer.patch(`/api/plans/${plan.id}`, { pieces: pocket(4).map(p => ({ ...p, copies: 2 })) }), 200)
    expect((await planned()).plannedGrams).toBeCloseTo(0.845, 9)
    // The yarn's length per weight halves: its floats weigh twice as much (0.045 m at 100 m/100 g = 0.045 g a copy).
    await made(as.designer.patch(`/api/yarns/${scrap.id}`, { metresPer100g: 100 }), 200)
    expect((await planned()).plannedGrams).toBeCloseTo(0.89, 9)
    await made(as.designer.patch(`/api/plans/${plan.id}`, { published: false }), 200)
    expect(await planned()).toMatchObject({ plannedGrams: 0, plannedIn: 0 })
    await made(as.designer.patch(`/api/plans/${plan.id}`, { published: true }), 200)
    expect((await planned()).plannedIn).toBe(1)
    expect((await as.designer.delete(`/api/plans/${plan.id}`)).status).toBe(204)
    expect(await planned()).toMatchObject({ plannedGrams: 0, plannedIn: 0 })
  })

  it('knitters see published plans only; designers write', async () => {
    const draft = await made(as.designer.post('/api/plans', handbookPlan({ name: 'Draft plan' })))
    expect((await as.knitter.get(`/api/plans/${draft.id}`)).status).toBe(404)
    expect((await as.knitter.get(`/api/plans?studioId=${s.studio.id}`)).body.map((p: any) => p.id)).not.toContain(draft.id)
    expect((await as.designer.get(`/api/plans?studioId=${s.studio.id}`)).body.map((p: any) => p.id)).toContain(draft.id)
    const published = await made(as.designer.patch(`/api/plans/${draft.id}`, { published: true }), 200)
    expect(published).toMatchObject({ published: true, updatedBy: { id: s.designer.id } })
    expect((await as.knitter.get(`/api/plans?studioId=${s.studio.id}`)).body.map((p: any) => p.id)).toContain(draft.id)
    expect((await as.knitter.patch(`/api/plans/${draft.id}`, { name: 'Mine' })).status).toBe(403)
    expect((await as.outsider.get(`/api/plans/${draft.id}`)).status).toBe(404)
    expect((await as.knitter.delete(`/api/plans/${draft.id}`)).status).toBe(403)
    expect((await as.designer.delete(`/api/plans/${draft.id}`)).status).toBe(204)
  })

  it('shares a published plan with someone outside the studio: a knitter invitation that lands on the plan', async () => {
    const plan = await made(as.designer.post('/api/plans', handbookPlan({ name: 'Shared plan' })))
    const email = `guest-${randomUUID()}@example.test`
    expect((await as.designer.post(`/api/plans/${plan.id}/share`, { email })).status).toBe(409) // not published yet
    await made(as.designer.patch(`/api/plans/${plan.id}`, { published: true }), 200)
    expect((await as.knitter.post(`/api/plans/${plan.id}/share`, { email })).status).toBe(403)
    expect((await as.designer.post(`/api/plans/${plan.id}/share`, { email: 'not-an-address' })).status).toBe(400)
    await made(as.designer.post(`/api/plans/${plan.id}/share`, { email }))

    const mail = await waitForMail(email)
    expect(mail.text).toContain('Shared plan')
    const link = linkIn(mail, '/invitations/')
    expect(link.searchParams.get('then')).toBe(`/plans/${plan.id}`)
    const guest = apiClient()
    const accepted = await guest.post(`${link.pathname}/accept`.replace('/invitations/', '/api/invitations/'), {
      name: 'Guest Knitter',
      password: 'guest-password-1',
    })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body.studios).toContainEqual(expect.objectContaining({ id: s.studio.id, role: 'knitter' }))
    expect((await guest.get(`/api/plans/${plan.id}`)).status).toBe(200)
  })

  it.each([
    [{ pieces: [] }, 'pieces'],
    [{ floatLimit: 0 }, 'floatLimit'],
    [{ yarns: [{ slot: 'Z', yarnId: 1 }] }, 'yarns.0.slot'],
    [{ pieces: [{ name: 'Back', targetWidth: 50, targetLength: 60, sections: [{ kind: 'plain', yarn: 'A' }] }] }, 'pieces.0.sections.0.rows'],
    [
      { pieces: [{ name: 'Back', targetWidth: 50, targetLength: 60, sections: [{ kind: 'shaping', change: 'sideways', stitchesEachSide: 2, rows: 10 }] }] },
      'pieces.0.sections.0.change',
    ],
    [{ pieces: [{ name: 'Back', targetWidth: 0, targetLength: 60, sections: [{ kind: 'plain', rows: 2, yarn: 'A' }] }] }, 'pieces.0.targetWidth'],
  ])('POST /api/plans names the bad field (%j → %s)', async (overrides, field) => {
    const res = await as.designer.post('/api/plans', handbookPlan(overrides))
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.message).toContain(`${field}:`)
    expect(res.body.data.issues.map((i: any) => i.path.join('.'))).toContain(field)
  })

  it('refuses a yarn or motif of another studio, naming the field', async () => {
    const theirs = await made(as.outsider.post('/api/yarns', { ...yarn(), studioId: s.elsewhere.id }))
    const res = await as.designer.post('/api/plans', handbookPlan({ yarns: [{ slot: 'A', yarnId: stock.oat.id }, { slot: 'B', yarnId: theirs.id }] }))
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toEqual(['yarns', '1', 'yarnId'])
  })

  it('a project started from a published plan keeps its snapshot when the plan changes', async () => {
    const plan = await made(as.designer.post('/api/plans', handbookPlan({ name: 'Snapshot jumper' })))
    expect((await as.designer.post(`/api/plans/${plan.id}/projects`, {})).status).toBe(409) // not published yet
    await made(as.designer.patch(`/api/plans/${plan.id}`, { published: true }), 200)

    const project = await made(as.knitter.post(`/api/plans/${plan.id}/projects`, {}))
    expect(project).toMatchObject({ name: 'Snapshot jumper', knitter: { id: s.knitter.id }, pieceCount: 2, machineId: stock.machine.id })
    expect(project.pieces.map((p: any) => [p.name, p.totalRows])).toEqual([['Sleeve 1 of 2', 340], ['Sleeve 2 of 2', 340]])
    expect(project.yarns.map((y: any) => [y.slot, y.yarnId, y.symbol])).toEqual([['A', stock.oat.id, '●'], ['B', stock.navy.id, '▲']])
    const before = (await as.knitter.get(`/api/pieces/${project.pieces[0].id}`)).body.timeline
    expect(before.needles).toBe(50)
    // The planner's preview draws exactly the timeline the project froze, as the knitter sees the
    // plan (its motif is a draft: the knitter sees "Motif" where designers see its name).
    expect((await as.knitter.get(`/api/plans/${plan.id}`)).body.pieces[0].numbers.preview.timeline).toEqual(before)
    // Notes join the next section with rows; shaping rows are plain rows in the yarn before.
    expect(before.sections.map((x: any) => [x.kind, x.rows ?? x.chartRows, x.yarn ?? x.main, x.note])).toEqual([
      ['plain', 196, 'A', 'Cast on with waste yarn — Stitch size 6'],
      ['plain', 140, 'A', 'Increase 1 stitch each side every 3rd row ×4, every 4th row ×32 (122 stitches after)'],
      ['motif', 4, 'A', 'Cast off loosely'],
    ])

    const edited = await made(as.designer.patch(`/api/plans/${plan.id}`, {
      pieces: [{ name: 'Sleeve', targetWidth: 12, targetLength: 20, unit: 'in', sections: [{ kind: 'plain', rows: 10, yarn: 'B' }] }],
    }), 200)
    expect(edited.pieces[0].numbers).toMatchObject({ needles: 66, machineRows: 10 })
    const after = await as.knitter.get(`/api/pieces/${project.pieces[0].id}`)
    expect(after.body.timeline).toEqual(before)
    expect(after.body.totalRows).toBe(340)

    const one = await made(as.knitter.post(`/api/plans/${plan.id}/projects`, { name: 'Just one', pieces: [0] }))
    expect(one.pieces.map((p: any) => p.name)).toEqual(['Sleeve'])
    const bad = await as.knitter.post(`/api/plans/${plan.id}/projects`, { pieces: [3] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toEqual(['pieces'])
  })

  it('production shows who knits what, how far, and a finish estimate from their pace', async () => {
    const plan = await made(as.designer.post('/api/plans', handbookPlan({ name: 'Production jumper', published: true })))
    const project = await made(as.knitter.post(`/api/plans/${plan.id}/projects`, {}))
    const pieceId = project.pieces[0].id
    // Five single rows 30 s apart → 30 s a row (common practice for the knit view's estimate).
    const start = Date.now() - 10 * 60_000
    const events = Array.from({ length: 5 }, (_, i) => ({
      id: randomUUID(), pieceId, kind: 'advance', from: i, to: i + 1, version: i, at: new Date(start + i * 30_000).toISOString(),
    }))
    await made(as.knitter.post('/api/sync', { deviceId: 'production-test', events }), 200)

    const list = await made(as.owner.get(`/api/studios/${s.studio.id}/production`), 200)
    const row = list.find((x: any) => x.projectId === project.id)
    expect(row).toMatchObject({
      name: 'Production jumper', status: 'knitting', knitter: { id: s.knitter.id }, plan: { id: plan.id, name: 'Production jumper' },
      pieceCount: 2, piecesDone: 0, completedRows: 5, totalRows: 680, msPerRow: 30_000,
    })
    expect(row.progress).toBeCloseTo(5 / 680, 9)
    // 675 rows left × 30 s = 5 h 37 min 30 s → "about 5 h 38 min".
    expect(row.timeLeft).toBe('about 5 h 38 min')
    expect(Date.parse(row.estimatedFinish) - Date.now()).toBeGreaterThan(675 * 30_000 - 60_000)
    expect((await as.knitter.get(`/api/studios/${s.studio.id}/production`)).status).toBe(403)
  })

  it('mails the studio owner when the last row of a project is knitted', async () => {
    const plan = await made(as.designer.post('/api/plans', handbookPlan({
      name: 'Tiny swatch bag', published: true, pieces: [{ name: 'Bag', targetWidth: 5, targetLength: 1, sections: [{ kind: 'plain', rows: 4, yarn: 'A' }] }],
    })))
    const project = await made(as.knitter.post(`/api/plans/${plan.id}/projects`, {}))
    const step = { id: randomUUID(), pieceId: project.pieces[0].id, kind: 'advance', from: 0, to: 4, version: 0, at: new Date().toISOString() }
    await made(as.knitter.post('/api/sync', { deviceId: 'finish-test', events: [step] }), 200)
    const mail = await waitForMail(s.owner.email)
    expect(mail.subject).toBe('Finished: Tiny swatch bag')
    expect(mail.text).toContain(`${s.knitter.name} has finished "Tiny swatch bag": 1 piece (Bag), 4 machine rows.`)
    expect(linkIn(mail, '/projects/').pathname).toBe(`/projects/${project.id}`)
    expect((await as.owner.get(`/api/studios/${s.studio.id}/production`)).body.map((x: any) => x.projectId)).not.toContain(project.id)
  })
})
