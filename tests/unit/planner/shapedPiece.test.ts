import { describe, expect, it } from 'vitest'
import { estimateRowsYarn, gaugePer10cm, KnittingInputError } from '#shared/engine'
import { compilePieceTimeline } from '#shared/piece/timeline'
import { cuesForStep, knitPosition, shapingRow } from '#shared/piece/position'
import { piecePicture } from '#shared/planner/piecePicture'
import { sectionRows } from '#shared/planner/sectionRows'
import type { PlanPieceContext } from '#shared/planner/planPiece'
import { shapedKnittedRows, workShapedPiece } from '#shared/planner/shapedPiece'
import type { PlanPieceInput } from '#shared/types/plan'
import { frontSpec } from '../../support/shapeSpecs'

const ctx = (overrides: Partial<PlanPieceContext> = {}): PlanPieceContext => ({
  gauge: gaugePer10cm({ stitchesPer10cm: 30, rowsPer10cm: 40 }),
  technique: 'together', passesPerColour: 2, floatLimit: 5,
  yarns: [{ slot: 'A', name: 'Oat', hex: '#e8dcc0' }, { slot: 'B', name: 'Navy', hex: '#1c2a4a' }],
  motifs: new Map([[7, { name: 'Checks', chart: ['x.', '.x'] }], [8, { name: 'Bars', chart: ['x.......'] }]]),
  ...overrides,
})
const piece = (sections: PlanPieceInput['sections']): PlanPieceInput => ({
  name: 'Front', copies: 1, targetWidth: 50, targetLength: 56, unit: 'cm', ease: 0, sections,
})
const welt = { kind: 'plain' as const, label: 'Welt', rows: 20, yarn: 'A' }
const checks = { kind: 'motif' as const, motifId: 7, placement: 'centred' as const, chartRows: 40, main: 'A', contrast: 'B' }

describe('workShapedPiece — the worked front (tests/unit/engine/shapePiece.test.ts) with a welt and a band of checks', () => {
  const w = workShapedPiece(piece([welt, checks]), frontSpec, 'M', ctx())
  const shape = w.timeline.shape!

  it('casts on the shape\'s 150 and tops the sections up to the piece\'s height with plain A', () => {
    expect(w.needles).toBe(150)
    expect(w.shape).toMatchObject({ size: 'M', castOn: 150, sectionRows: 60 })
    const height = w.shape!.height
    expect(w.timeline.sections.map(s => [s.label, s.kind === 'plain' ? s.rows : s.chartRows])).toEqual([['Welt', 20], ['Checks', 40], ['Plain to the top', height - 60]])
    expect(w.machineRows).toBe(shape.rows.length)
    expect(w.shape!.widest).toBe(162) // the chest: 150 + 6 each side
  })

  it('knits the left of the neck on the same fabric rows (and yarns) as the right', () => {
    const compiled = compilePieceTimeline(w.timeline)
    const firstRight = shape.rows.findIndex(r => r.part === 'right')
    const firstLeft = shape.rows.findIndex(r => r.part === 'left')
    expect(shape.rows[firstLeft]!.row).toBe(shape.rows[firstRight]!.row)
    expect(compiled.rows[firstLeft]).toEqual({ ...compiled.rows[firstRight]!, rowInSection: 0 })
  })

  it('counts the contrast by the real width of each row: 3 rows at 150, 24 at 152, 13 at 154, half of each in B', () => {
    // Increases on rows 24 and 48 (every 24th row, 1-based) widen rows 23… and 47… (0-based).
    // Checks rows 20–59: (3 × 150 + 24 × 152 + 13 × 154) / 2 = 6100 / 2 = 3050 stitches of B.
    const compiled = compilePieceTimeline(w.timeline)
    const rows = shapedKnittedRows(w.timeline, compiled, w.offsets)
    const yarns = { A: { metresPer100g: 400 }, B: { metresPer100g: 400 } }
    const e = estimateRowsYarn({ rows, swatch: { stitches: 1200, grams: 10 }, needlePitchMm: 4.5, yarns })
    expect(e.yarns.find(y => y.yarn === 'B')!.stitches).toBe(3050)
    const knitted = rows.reduce((n, r) => n + r.knitTo - r.knitFrom, 0)
    expect(e.yarns.reduce((n, y) => n + y.stitches, 0)).toBe(knitted)
  })

  it('a pair step never runs from one side of the neck into the other', () => {
    const compiled = compilePieceTimeline(w.timeline)
    const firstLeft = shape.rows.findIndex(r => r.part === 'left')
    // Each side has an odd count of rows (the parity rule), so a pair from the start of the right side ends one row short of the left.
    expect((firstLeft - shape.rows.findIndex(r => r.part === 'right')) % 2).toBe(1)
    expect(knitPosition(w.timeline, compiled, firstLeft - 1, 2).stepRows).toEqual([firstLeft, firstLeft])
    expect(knitPosition(w.timeline, compiled, firstLeft, 2).stepRows).toEqual([firstLeft + 1, firstLeft + 2])
    expect(knitPosition(w.timeline, compiled, 0, 2).stepRows).toEqual([1, 2])
  })

  it('the preview lists the top twice, once for each side of the neck, in knitting order', () => {
    const compiled = compilePieceTimeline(w.timeline)
    const split = shape.rows.findIndex(r => r.part === 'right')
    const left = shape.rows.findIndex(r => r.part === 'left')
    expect(sectionRows(w.timeline, compiled).map(r => [r.label, r.part ?? 'whole', r.from, r.to])).toEqual([
      ['Welt', 'whole', 1, 20],
      ['Checks', 'whole', 21, 60],
      ['Plain to the top', 'whole', 61, split],
      ['Plain to the top', 'right', split + 1, left],
      ['Plain to the top', 'left', left + 1, shape.rows.length],
    ])
  })

  it('checks floats at the real width of each row', () => {
    expect(w.sections[1]!.maxFloat).toEqual([1, 1])
    const bars = workShapedPiece(piece([welt, { ...checks, motifId: 8 }]), frontSpec, 'M', ctx())
    expect(bars.sections[1]!.maxFloat).toEqual([1, 7])
  })

  it('cuts sections that run past the top', () => {
    const tall = workShapedPiece(piece([welt, { ...checks, chartRows: 1000 }]), frontSpec, 'M', ctx())
    expect(tall.timeline.sections.map(s => s.label)).toEqual(['Welt', 'Checks'])
    expect(tall.shape!.sectionRows).toBe(1020)
  })

  it('refuses a shaping section, a machine feeding colours one by one, and a bad spec, by field', () => {
    const refusal = (f: () => unknown) => {
      try { f() }
      catch (e) { return e instanceof KnittingInputError ? e.field : 'not a KnittingInputError' }
      return 'no refusal'
    }
    expect(refusal(() => workShapedPiece(piece([welt, { kind: 'shaping', change: 'increase', stitchesEachSide: 2, rows: 10 }]), frontSpec, 'M', ctx())))
      .toBe('sections[1].kind')
    expect(refusal(() => workShapedPiece(piece([welt]), frontSpec, 'M', ctx({ technique: 'colour-by-colour' })))).toBe('shape')
    expect(refusal(() => workShapedPiece(piece([welt]), { ...frontSpec, neck: { width: 60, depth: 8, shape: 'round' } }, 'M', ctx()))).toBe('shape.neck.width')
  })
})

describe('piecePicture of a shaped piece', () => {
  it('draws the worked front: 150 at the cast-on, 162 at the chest, the neck open between the two sides at the top', () => {
    const w = workShapedPiece(piece([welt, checks]), frontSpec, 'M', ctx())
    const p = piecePicture(w.timeline, w.offsets, w.shaping)
    expect([p.width, p.height]).toEqual([162, w.shape!.height])
    const across = (row: number) => Array.from(p.cells.subarray(row * p.width, (row + 1) * p.width))
    const filled = (row: number) => across(row).filter(c => c > 0).length
    expect(filled(0)).toBe(150)
    expect(across(0).slice(0, 6).every(c => c === 0)).toBe(true) // the chest's 6 extra needles each side are not cast on
    expect(filled(w.shape!.counts.rowsToUnderarm - 1)).toBe(162)
    // The checks start on row 20, fixed to the bed: needle n is contrast (slot B = 2) when (offset + n) is even.
    const n = 10 // a needle of the cast-on; in the picture it sits 6 to the right
    expect(across(20)[6 + n]).toBe((w.offsets[1]! + n) % 2 === 0 ? 2 : 1)
    // Below the shoulder the neck's centre is open, the two sides knitted on either side of it.
    const top = w.shape!.height - 3
    const row = across(top)
    expect(row[81]).toBe(0)
    expect(filled(top)).toBeGreaterThan(0)
    expect(row.slice(0, 81).filter(c => c > 0).length).toBe(row.slice(81).filter(c => c > 0).length)
  })
})

describe('cues at the machine for a shaped piece', () => {
  it('rings the step before a shaping row, and not between them (common practice: warn before the carriage reaches it)', () => {
    const w = workShapedPiece(piece([welt, checks]), frontSpec, 'M', ctx())
    const compiled = compilePieceTimeline(w.timeline)
    const rows = w.timeline.shape!.rows
    // The first side increase is on row 24 (index 23): the pair ending at 22 completed rows rings, the one ending at 20 does not.
    expect(rows[23]!.increase).toEqual({ left: 1, right: 1 })
    expect(shapingRow(rows, 23)).toBe(true)
    expect(cuesForStep(compiled, w.timeline, 20, 22, 2)).toContain('shaping')
    expect(cuesForStep(compiled, w.timeline, 18, 20, 2)).not.toContain('shaping')
    // The left side starting is a shaping row too (the held needles come back).
    const firstLeft = rows.findIndex(r => r.part === 'left')
    expect(shapingRow(rows, firstLeft)).toBe(true)
  })
})
