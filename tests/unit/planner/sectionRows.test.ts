import { describe, expect, it } from 'vitest'
import { compilePieceTimeline } from '#shared/piece/timeline'
import { sectionRows } from '#shared/planner/sectionRows'
import type { PieceTimeline } from '#shared/piece/types'

// Worked by hand from compilePlan's declared model (shared/engine/rows.ts).
const timeline = (technique: PieceTimeline['technique']): PieceTimeline => ({
  technique, passesPerColour: 2, needles: 10,
  yarns: [{ slot: 'A', name: 'Oat', hex: '#e8dcc0', symbol: '●' }, { slot: 'B', name: 'Navy', hex: '#1c2a4a', symbol: '▲' }],
  sections: [
    { kind: 'plain', label: 'Welt', rows: 6, yarn: 'A', note: 'Waste yarn first' },
    { kind: 'motif', label: 'Band', motifName: 'Band', chart: ['x.', '.x', 'xx'], chartRows: 3, main: 'A', contrast: 'B' },
    { kind: 'plain', label: 'Top', rows: 4, yarn: 'B' },
  ],
})

describe('sectionRows', () => {
  it('colours fed together: one machine row per chart row; changes at the motif start and at the top', () => {
    expect(sectionRows(timeline('together'), compilePieceTimeline(timeline('together')))).toEqual([
      { section: 0, label: 'Welt', note: 'Waste yarn first', from: 1, to: 6, yarns: ['A'], changes: 0 },
      // row 7: [A] → [A, B] is a change
      { section: 1, label: 'Band', note: '', from: 7, to: 9, yarns: ['A', 'B'], changes: 1 },
      // row 10: [A, B] → [B]
      { section: 2, label: 'Top', note: '', from: 10, to: 13, yarns: ['B'], changes: 1 },
    ])
  })

  it('colour by colour, 2 passes each: 4 machine rows per chart row, a change every 2 rows in the motif', () => {
    const rows = sectionRows(timeline('colour-by-colour'), compilePieceTimeline(timeline('colour-by-colour')))
    // Motif rows 7–18: A A B B | A A B B | A A B B. Changes at rows 9, 11, 13, 15, 17 (the first
    // motif row keeps A from the welt, so no change there); row 19 goes B → B: none.
    expect(rows.map(r => [r.from, r.to, r.changes])).toEqual([[1, 6, 0], [7, 18, 5], [19, 22, 0]])
  })
})
