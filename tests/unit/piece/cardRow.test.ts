import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { CompiledPlan } from '#shared/engine'
import { cardLoopRows, cardRowAt } from '#shared/piece/cardRow'
import { knitPosition } from '#shared/piece/position'
import { compilePieceTimeline } from '#shared/piece/timeline'
import type { PieceTimeline } from '#shared/piece/types'

// Worked by hand. A 4-stitch, 6-row chart on a 24-hole card whose shortest loop is 36 rows:
// 6 repeats down, a 36-row loop. The piece: 4 plain rows, 40 motif rows, 2 plain rows, both
// yarns in one pass (one card row a row). Motif row 1 is machine row 5 (index 4).
const yarns = [
  { slot: 'A', name: 'Cream', hex: '#efe6d2', symbol: '●' },
  { slot: 'B', name: 'Ink blue', hex: '#1d2f5a', symbol: '▲' },
]
const chart = ['x...', '.x..', '..x.', '...x', 'xx..', '..xx']
const piece = (readerOffset: number, width = 24, minRows = 36): PieceTimeline => ({
  technique: 'together',
  passesPerColour: 1,
  needles: 48,
  yarns,
  sections: [
    { kind: 'plain', label: 'Welt', rows: 4, yarn: 'A' },
    { kind: 'motif', label: 'Band', motifName: 'Steps', chart, chartRows: 40, main: 'A', contrast: 'B' },
    { kind: 'plain', label: 'Top', rows: 2, yarn: 'A' },
  ],
  card: { width, minRows, readerOffset },
})

describe('cardLoopRows', () => {
  it('is whole chart repeats covering the shortest card, or null when the repeat does not go into the width', () => {
    expect(cardLoopRows({ width: 24, minRows: 36, readerOffset: 0 }, 4, 6)).toBe(36)
    expect(cardLoopRows({ width: 24, minRows: 20, readerOffset: 0 }, 4, 6)).toBe(24) // 4 repeats of 6 cover 20
    expect(cardLoopRows({ width: 24, minRows: 36, readerOffset: 0 }, 5, 6)).toBeNull()
  })
})

describe('cardRowAt (the piece above)', () => {
  it('reads the row knitted with no offset: card row 1 on the section’s first row, round the loop after 36', () => {
    const t = piece(0)
    const c = compilePieceTimeline(t)
    expect(cardRowAt(t, c, 3)).toBeNull() // last welt row: plain
    expect(cardRowAt(t, c, 4)).toEqual({ knitting: 1, atReader: 1, loopRows: 36, lockRow: 1 })
    expect(cardRowAt(t, c, 5)).toEqual({ knitting: 2, atReader: 2, loopRows: 36, lockRow: null })
    expect(cardRowAt(t, c, 4 + 35)?.knitting).toBe(36)
    expect(cardRowAt(t, c, 4 + 36)?.knitting).toBe(1) // the loop comes round
    expect(cardRowAt(t, c, 44)).toBeNull() // top band
  })

  it('with a reader 2 rows ahead: lock the card at row 3, and the reader is 2 rows on, round the loop', () => {
    const t = piece(2)
    const c = compilePieceTimeline(t)
    expect(cardRowAt(t, c, 4)).toEqual({ knitting: 1, atReader: 3, loopRows: 36, lockRow: 3 })
    expect(cardRowAt(t, c, 4 + 34)).toMatchObject({ knitting: 35, atReader: 1 }) // 35 + 2 = 37 → row 1
  })

  it('says nothing without a card, or when the repeat does not go into the card', () => {
    const { card: _none, ...noCard } = piece(0)
    expect(cardRowAt(noCard, compilePieceTimeline(noCard), 4)).toBeNull()
    const t = piece(0, 26)
    expect(cardRowAt(t, compilePieceTimeline(t), 4)).toBeNull()
  })

  it('a second stretch of the section (the other side of a neck) locks at the card row carrying its first chart row', () => {
    // By hand: the right side knits motif rows 0–4, then the left side knits rows 3–4 again.
    const t = piece(0)
    const rows: CompiledPlan['rows'] = [0, 1, 2, 3, 4].map(k => ({ section: 1, yarns: ['A', 'B'], chartRow: k % 6, rowInSection: k }))
    rows.push({ section: 1, yarns: ['A', 'B'], chartRow: 3, rowInSection: 0 }, { section: 1, yarns: ['A', 'B'], chartRow: 4, rowInSection: 1 })
    const c: CompiledPlan = { rows, changes: [] }
    expect(cardRowAt(t, c, 5)).toEqual({ knitting: 4, atReader: 4, loopRows: 36, lockRow: 4 })
    expect(cardRowAt(t, c, 6)).toMatchObject({ knitting: 5, lockRow: null })
  })
})

describe('cardRowAt, every row', () => {
  it('the card row knitted carries the chart row knitted, and the reader is the offset ahead round the loop', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 60 }), fc.integer({ min: 1, max: 80 }), (offset, minRows) => {
      const t = piece(offset, 24, minRows)
      const c = compilePieceTimeline(t)
      c.rows.forEach((r, i) => {
        const at = cardRowAt(t, c, i)
        if (r.chartRow === null) return expect(at).toBeNull()
        expect((at!.knitting - 1) % chart.length).toBe(r.chartRow)
        expect(at!.atReader - 1).toBe((at!.knitting - 1 + offset) % at!.loopRows)
      })
    }), { numRuns: 50 })
  })
})

describe('knitPosition with a card', () => {
  it('gives the card row, and the row to lock at when the motif section comes up', () => {
    const t = piece(2)
    const c = compilePieceTimeline(t)
    const before = knitPosition(t, c, 2)
    expect(before.card).toBeNull()
    expect(before.upcoming).toMatchObject({ row: 5, kind: 'section', cardLock: 3 })
    expect(knitPosition(t, c, 4).card).toMatchObject({ knitting: 1, atReader: 3, lockRow: 3 })
    expect(knitPosition(t, c, 10).upcoming).not.toHaveProperty('cardLock') // the top band is plain
  })
})
