import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { shapePiece } from '#shared/engine'
import { compilePieceTimeline } from '#shared/piece/timeline'
import { knitPosition } from '#shared/piece/position'
import { signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { frontSpec } from '../support/shapeSpecs'

// A sized, shaped plan through the API: measurements per size → numbers per size → a project
// knitted in one size, its rows in the shape's order (plan → project → knit view rows).

let s: Awaited<ReturnType<typeof makeStudio>>
const as = {} as Record<'knitter' | 'designer' | 'outsider', ApiClient>
let stock: Record<'machine' | 'swatch' | 'oat' | 'navy' | 'motif', any>
beforeAll(async () => {
  s = await makeStudio()
  for (const who of ['knitter', 'designer', 'outsider'] as const) as[who] = await signedIn(s[who].email, fixturePassword)
  const yarn = (name: string, hex: string) => ({ studioId: s.studio.id, name, hex, weightCategory: 1, metresPer100g: 400, gramsOnHand: 500 })
  stock = {
    machine: await made(as.designer.post('/api/machines', { studioId: s.studio.id, name: 'Shaping machine', needlePitchMm: 4.5, needles: 200, patterningWidth: 24 })),
    // 30 sts and 40 rows over 10 cm: the gauge of the hand-worked front (tests/unit/engine/shapePiece.test.ts).
    swatch: await made(as.designer.post('/api/swatches', { studioId: s.studio.id, stitches: 30, rows: 40, width: 10, height: 10, unit: 'cm', grams: 6 })),
    oat: await made(as.designer.post('/api/yarns', yarn('Oat', '#E8DCC0'))),
    navy: await made(as.designer.post('/api/yarns', yarn('Navy', '#1c2a4a'))),
    motif: await made(as.designer.post('/api/motifs', { studioId: s.studio.id, name: 'Checks', rows: ['x.', '.x'], published: true })),
  }
})
afterAll(closeTestDb)

async function made(res: Promise<{ status: number; body: any }>, status = 201) {
  const r = await res
  expect(r.status, JSON.stringify(r.body)).toBe(status)
  return r.body
}

// Size S is the worked front exactly (its carriage at the left seen from the knit side is at the
// knitter's right); M adds 4 cm of width and 2 cm of length.
const front = () => ({
  name: 'Front', targetWidth: 50, targetLength: 56, unit: 'cm',
  shape: {
    kind: 'body', carriageStart: 'right', armhole: true, shoulder: 'cast-off', neck: 'round', cap: false,
    measurements: {
      hemWidth: [50, 54], width: [54, 58], lengthToUnderarm: [36, 38],
      armholeCastOff: [2, 2], armholeDecrease: [1, 1], armholeDepth: [20, 20],
      shoulderWidth: [16, 17], shoulderDrop: [1.5, 1.5], neckWidth: [16, 17], neckDepth: [8, 8],
    },
    ease: {},
  },
  sections: [
    { kind: 'plain', label: 'Welt', rows: 20, yarn: 'A' },
    { kind: 'motif', motifId: stock.motif.id, placement: 'centred', chartRows: 40, main: 'A', contrast: 'B' },
  ],
})
const plan = (overrides: Record<string, unknown> = {}) => ({
  studioId: s.studio.id, name: 'Shaped jumper', machineId: stock.machine.id, swatchId: stock.swatch.id,
  yarns: [{ slot: 'A', yarnId: stock.oat.id }, { slot: 'B', yarnId: stock.navy.id }], sizes: ['S', 'M'], pieces: [front()], ...overrides,
})

describe('sized, shaped plans', () => {
  it('works every size out; the numbers of size S are the hand-worked front\'s', async () => {
    const p = await made(as.designer.post('/api/plans', plan()))
    expect(p.sizes).toEqual(['S', 'M'])
    expect(p.size).toBe(0)
    const worked = shapePiece(frontSpec, { stitchesPer10cm: 30, rowsPer10cm: 40 })
    expect(p.pieces[0].numbers.shape).toMatchObject({ size: 'S', castOn: 150, widest: 162, machineRows: worked.rows.length, counts: worked.counts })
    expect(p.pieces[0].sizeCounts.map((c: any) => [c.size, c.castOn])).toEqual([['S', 150], ['M', 162]])
    const m = await made(as.designer.get(`/api/plans/${p.id}?size=1`), 200)
    expect(m.size).toBe(1)
    expect(m.pieces[0].numbers.shape).toMatchObject({ size: 'M', castOn: 162 })
    expect(m.estimate.model).toContain('real width')
    const none = await as.designer.get(`/api/plans/${p.id}?size=2`)
    expect(none.status).toBe(400)
    expect(none.body.message).toContain('no size 2 (it has 2: S, M)')
    expect((await as.outsider.get(`/api/plans/${p.id}?size=1`)).status).toBe(404)
  })

  it('refuses shapes that do not fit the sizes or the piece, naming the field', async () => {
    const bad = await as.designer.post('/api/plans', plan({ sizes: ['S', 'M', 'L'] }))
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path.join('.')).toMatch(/^pieces\.0\.shape\.measurements\./)
    const p = await made(as.designer.post('/api/plans', plan({ name: 'Sizes later' })))
    // Sizes alone must still fit the stored shapes.
    const sizesOnly = await as.designer.patch(`/api/plans/${p.id}`, { sizes: ['S'] })
    expect(sizesOnly.status).toBe(400)
    expect(sizesOnly.body.message).toMatch(/pieces\.0\.shape\.measurements\.\w+: has 2 numbers but the plan has 1 size/)
    // A neck wider than the shoulders leave room for is saved, and the size that cannot be worked out says why.
    const wide = front()
    wide.shape.measurements.neckWidth = [16, 40]
    const saved = await made(as.designer.patch(`/api/plans/${p.id}`, { pieces: [wide] }), 200)
    expect(saved.pieces[0].sizeCounts[1].error).toMatch(/^shoulder\.width: 2 shoulders of 51 and a neck of 120 stitches/)
    const m = await made(as.designer.get(`/api/plans/${p.id}?size=1`), 200)
    expect(m.warnings.find((w: any) => w.kind === 'section').message).toMatch(/Front: size M: shape\.shoulder\.width/)
  })

  it('a project in size M freezes that size\'s shape; its rows follow the shape through both sides of the neck', async () => {
    const p = await made(as.designer.post('/api/plans', plan({ name: 'Knit in M', published: true })))
    const project = await made(as.knitter.post(`/api/plans/${p.id}/projects`, { size: 1 }))
    expect(project.name).toBe('Knit in M · size M')
    const pieceId = project.pieces[0].id
    const { body: piece } = await as.knitter.get(`/api/pieces/${pieceId}`)
    expect(piece.timeline.shape).toMatchObject({ size: 'M', kind: 'body', castOn: 162 })
    expect(piece.timeline.needles).toBe(162)
    const compiled = compilePieceTimeline(piece.timeline)
    expect(piece.totalRows).toBe(piece.timeline.shape.rows.length)
    expect(compiled.rows).toHaveLength(piece.totalRows)
    // Knit to the first row of the left side: the knit view is there, in the top section again.
    const firstLeft = piece.timeline.shape.rows.findIndex((r: any) => r.part === 'left')
    const step = { id: randomUUID(), pieceId, kind: 'jump', from: 0, to: firstLeft, version: 0, at: new Date().toISOString() }
    await made(as.knitter.post('/api/sync', { deviceId: 'shaped-test-1', events: [step] }), 200)
    const { body: after } = await as.knitter.get(`/api/pieces/${pieceId}`)
    expect(after.completedRows).toBe(firstLeft)
    const at = knitPosition(after.timeline, compiled, after.completedRows)
    expect(at.row).toBe(firstLeft + 1)
    expect(at.section!.row).toBe(1) // the left side starts its stretch of the section again
    const bad = await as.knitter.post(`/api/plans/${p.id}/projects`, { size: 2 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toEqual(['size'])
  })
})
