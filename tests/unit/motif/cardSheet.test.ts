import { describe, expect, it } from 'vitest'
import { cardSheetLayout, holeCentre, LABEL_MM, PAPER_MM, rowsPerSheet, rulerTicks } from '#shared/motif/cardSheet'

// The punch card on paper, in mm. Worked by hand: A4 is 297 mm high; less 2 × 10 mm margin,
// 75 mm for the heading, ruler and note, 2 × 3 mm padding and one row pitch at each card end
// (2 × 5 mm) leaves 186 mm, 37 rows at 5 mm.

const card = { width: 24, holePitchMm: 4.5, rowPitchMm: 5, paper: 'A4' as const }

describe('cardSheetLayout', () => {
  it.each([
    ['A4', 5, 37],
    ['Letter', 5, 33], // 279.4 − 20 − 75 − 6 − 10 = 168.4 mm
    ['A4', 200, 1], // never less than one row a sheet
  ] as const)('%s at %d mm a row holds %d rows', (paper, pitch, rows) => {
    expect(rowsPerSheet(paper, pitch)).toBe(rows)
  })

  it('keeps a card that fits on one sheet, with the cut line at both ends', () => {
    const layout = cardSheetLayout({ ...card, rows: 36 })
    expect(layout.cardWidthMm).toBe(24 * 4.5 + 2 * 6)
    expect(layout.cardLengthMm).toBe(38 * 5)
    expect(layout.sheets).toHaveLength(1)
    const [s] = layout.sheets
    expect(s).toMatchObject({ index: 1, fromRow: 0, toRow: 36, cutTop: true, cutBottom: true, topY: 3, bottomY: 3 + 38 * 5 })
    expect(s!.widthMm).toBe(120 + 2 * LABEL_MM)
    expect(s!.heightMm).toBe(s!.bottomY + 3)
    expect(s!.widthMm).toBeLessThanOrEqual(PAPER_MM.A4.width - 20)
  })

  it('splits a long card over sheets, numbering rows as on the whole card', () => {
    const layout = cardSheetLayout({ ...card, rows: 80 })
    expect(layout.sheets.map(s => [s.fromRow, s.toRow, s.cutBottom, s.cutTop])).toEqual([
      [0, 37, true, false], [37, 74, false, false], [74, 80, false, true],
    ])
    // Every sheet fits the paper inside its margins with room for the rest of the sheet.
    for (const s of layout.sheets) expect(s.heightMm + 75).toBeLessThanOrEqual(PAPER_MM.A4.height - 20)
  })

  it('puts hole centres at the pitch, row 1 at the bottom, and the join lines one row apart', () => {
    const layout = cardSheetLayout({ ...card, rows: 38 })
    const [first, second] = layout.sheets as [NonNullable<typeof layout.sheets[0]>, NonNullable<typeof layout.sheets[0]>]
    expect(holeCentre(layout, first, 0, 0)).toEqual({ x: LABEL_MM + 6 + 2.25, y: 3 + 36.5 * 5 })
    expect(holeCentre(layout, first, 23, 0).x - holeCentre(layout, first, 0, 0).x).toBeCloseTo(23 * 4.5, 9)
    expect(holeCentre(layout, first, 0, 0).y - holeCentre(layout, first, 0, 1).y).toBe(5)
    // Row 37 (0-based 36) is the top row of sheet 1, half a pitch under its join line.
    expect(holeCentre(layout, first, 0, 36).y - first.topY).toBe(2.5)
    // Row 38 is on sheet 2, under the cut line at the card's top, half a pitch over its join line.
    expect(holeCentre(layout, second, 0, 37).y).toBe(3 + 5 + 2.5)
    expect(second.bottomY - holeCentre(layout, second, 0, 37).y).toBe(2.5)
  })
})

describe('rulerTicks', () => {
  it('gives 10 cm with a tick each mm, longer at 5 mm, numbered at each cm', () => {
    const ticks = rulerTicks()
    expect(ticks).toHaveLength(101)
    expect(ticks.at(-1)).toEqual({ x: 100, length: 5, label: '10' })
    expect(ticks.filter(t => t.label).map(t => t.x)).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100])
    expect(ticks[5]!.length).toBeGreaterThan(ticks[1]!.length)
    expect(ticks.every((t, i) => t.x === i)).toBe(true)
  })
})
