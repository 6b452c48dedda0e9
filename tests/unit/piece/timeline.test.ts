import { describe, expect, it } from 'vitest'
import { KnittingInputError } from '#shared/engine'
import { borderedMotifTimeline, compilePieceTimeline, slotYarns } from '#shared/piece/timeline'
import type { PieceTimeline } from '#shared/piece/types'

const yarns = slotYarns([{ name: 'Cream', hex: '#efe6d2' }, { name: 'Ink blue', hex: '#1d2f5a' }])

describe('slotYarns', () => {
  it('letters from A (main colour) and a symbol per slot, never colour alone', () => {
    expect(yarns).toEqual([
      { slot: 'A', name: 'Cream', hex: '#efe6d2', symbol: '●' },
      { slot: 'B', name: 'Ink blue', hex: '#1d2f5a', symbol: '▲' },
    ])
  })
})

describe('compilePieceTimeline', () => {
  // Row counting as in the plan tests (common practice): together = 1 machine row per chart row.
  it('together: border, motif repeating past its height, border; yarn ids are slot letters', () => {
    const t = borderedMotifTimeline({
      technique: 'together', needles: 120, yarns, motif: { name: 'Wave', chart: ['x.', '.x'] },
      chartRows: 3, borderBefore: 2, borderAfter: 1, labels: { before: 'Welt', after: 'Shoulder band' },
    })
    expect(t.sections.map(s => s.label)).toEqual(['Welt', 'Wave', 'Shoulder band'])
    const plan = compilePieceTimeline(t)
    expect(plan.rows.map(r => [r.section, r.yarns.join('+'), r.chartRow])).toEqual([
      [0, 'A', null], [0, 'A', null], [1, 'A+B', 0], [1, 'A+B', 1], [1, 'A+B', 0], [2, 'A', null],
    ])
    expect(plan.changes).toEqual([2, 5])
  })

  it('colour-by-colour: 2 × passes rows per chart row, main first; a 0-row border is left out', () => {
    const t = borderedMotifTimeline({
      technique: 'colour-by-colour', passesPerColour: 2, needles: 96, yarns, motif: { name: 'Dot', chart: ['1', '0'] },
      chartRows: 2, borderBefore: 0, borderAfter: 0,
    })
    expect(t.sections).toHaveLength(1)
    expect(t.sections[0]).toMatchObject({ chart: ['x', '.'] }) // stored in chartToRows form
    expect(compilePieceTimeline(t).rows.map(r => r.yarns.join(''))).toEqual(['A', 'A', 'B', 'B', 'A', 'A', 'B', 'B'])
  })

  it('names the section of a bad chart or a slot with no yarn', () => {
    const base: PieceTimeline = { technique: 'together', passesPerColour: 1, needles: 10, yarns, sections: [] }
    const bad = (sections: PieceTimeline['sections']) => {
      try { compilePieceTimeline({ ...base, sections }); return null }
      catch (e) { return e instanceof KnittingInputError ? e.field : e }
    }
    expect(bad([{ kind: 'plain', label: 'x', rows: 2, yarn: 'C' }])).toBe('sections[0].yarn')
    expect(
      bad([
        { kind: 'plain', label: 'x', rows: 2, yarn: 'A' },
        { kind: 'motif', label: 'm', motifName: 'm', chart: ['x?'], chartRows: 1, main: 'A', contrast: 'B' },
      ]),
    ).toBe('sections[1].chart')
    expect(bad([{ kind: 'plain', label: 'x', rows: 0, yarn: 'A' }])).toBe('plan.sections[0].rows')
  })
})
