import { describe, expect, it } from 'vitest'
import { gaugePer10cm, KnittingInputError } from '#shared/engine'
import { planSlotYarns, workPlanPiece, type PlanPieceContext } from '#shared/planner/planPiece'
import type { PlanPieceInput } from '#shared/types/plan'

// A plan piece → engine numbers and the timeline a project freezes (conversions declared in
// shared/planner/planPiece.ts).
const ctx = (overrides: Partial<PlanPieceContext> = {}): PlanPieceContext => ({
  gauge: gaugePer10cm({ stitchesPer10cm: 30, rowsPer10cm: 40 }),
  technique: 'together', passesPerColour: 2, floatLimit: 5,
  yarns: [{ slot: 'B', name: 'Navy', hex: '#1c2a4a' }, { slot: 'A', name: 'Oat', hex: '#e8dcc0' }],
  motifs: new Map([[7, { name: 'Checks', chart: ['x.', '.x'] }]]),
  ...overrides,
})
const piece = (sections: PlanPieceInput['sections'], overrides: Partial<PlanPieceInput> = {}): PlanPieceInput => ({
  name: 'Back', copies: 1, targetWidth: 20, targetLength: 10, unit: 'cm', ease: 0, sections, ...overrides,
})

describe('workPlanPiece', () => {
  it('counts needles with ease, rows from lengths, and puts notes on the next section with rows', () => {
    const w = workPlanPiece(piece([
      { kind: 'cast-on-note', text: 'Waste yarn' },
      { kind: 'plain', lengthCm: 2.5, yarn: 'A' },
      { kind: 'motif', motifId: 7, placement: 'centred', lengthCm: 1, main: 'A', contrast: 'B' },
      { kind: 'shaping', change: 'decrease', stitchesEachSide: 3, rows: 10 },
      { kind: 'setting-note', text: 'Tension down one' },
    ], { ease: 2 }), ctx())
    expect(w.needles).toBe(66) // (20 + 2) cm × 3 sts/cm (common practice: ease is added to the width)
    expect(w.targetRows).toBe(40)
    expect(w.sections.map(s => s.rows)).toEqual([0, 10, 4, 10, 0])
    expect(w.timeline.sections).toEqual([
      { kind: 'plain', label: 'Plain', rows: 10, yarn: 'A', note: 'Waste yarn' },
      { kind: 'motif', label: 'Checks', motifName: 'Checks', chart: ['x.', '.x'], chartRows: 4, main: 'A', contrast: 'B' },
      // Shaping rows are plain in the yarn of the section before (the motif's main colour).
      {
        kind: 'plain',
        label: 'Decreases',
        rows: 10,
        yarn: 'A',
        note: 'Decrease 1 stitch each side every 3rd row ×2, every 4th row ×1 (60 stitches after) — Tension down one',
      },
    ])
    expect(w.timeline.yarns.map(y => [y.slot, y.symbol])).toEqual([['A', '●'], ['B', '▲']])
    expect(w.machineRows).toBe(24)
    expect(w.offsets).toEqual([0, 0, 0])
  })

  it('colour-by-colour keeps the machine\'s passes per colour', () => {
    const w = workPlanPiece(
      piece([{ kind: 'motif', motifId: 7, placement: { offset: 1 }, chartRows: 3, main: 'A', contrast: 'B' }]),
      ctx({ technique: 'colour-by-colour', passesPerColour: 2 }),
    )
    expect(w.timeline.passesPerColour).toBe(2)
    expect(w.machineRows).toBe(12)
    expect(w.sections[0]!.placement).toMatchObject({ offset: 1, chartWidth: 2 })
  })

  it.each([
    [[{ kind: 'plain', rows: 2, yarn: 'C' }], 'sections[0].yarn'],
    [[{ kind: 'motif', motifId: 99, placement: 'centred', chartRows: 2, main: 'A', contrast: 'B' }], 'sections[0].motifId'],
    [[{ kind: 'shaping', change: 'increase', stitchesEachSide: 20, rows: 10 }], 'sections[0].stitchesEachSide'],
    [[{ kind: 'setting-note', text: 'Only a note' }], 'sections'],
  ] as [PlanPieceInput['sections'], string][])('a bad section names its field (%#: %s)', (sections, field) => {
    let error: unknown
    try { workPlanPiece(piece(sections), ctx()) }
    catch (e) { error = e }
    expect(error).toBeInstanceOf(KnittingInputError)
    expect((error as KnittingInputError).field).toBe(field)
  })
})

describe('planSlotYarns', () => {
  it('gives each slot the symbol of its letter, whatever the order', () => {
    expect(
      planSlotYarns([
        { slot: 'C', name: 'Red', hex: '#aa0000' },
        { slot: 'A', name: 'Oat', hex: '#e8dcc0' },
      ]).map(y => [y.slot, y.symbol]),
    ).toEqual([
      ['A', '●'],
      ['C', '■'],
    ])
  })
})
