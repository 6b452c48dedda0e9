import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { chartFromRows, longFloatCells } from '#shared/engine'
import type { Chart } from '#shared/engine'
import { rowRanges } from '../../../composables/useMotifFloats'
import { chartArb, knittedRow } from './helpers'

// Brute force: for every needle, walk left and right while the colour stays the same; the
// needle is in a long float when that run is longer than the limit and the row has both colours.
function bruteForce(chart: Chart, needles: number, offset: number, limit: number): Uint8Array {
  const marks = new Uint8Array(chart.width * chart.height)
  for (let r = 0; r < chart.height; r++) {
    const row = knittedRow(chart, r, needles, offset)
    if (row.every(c => c === row[0])) continue
    for (let i = 0; i < needles; i++) {
      let a = i, b = i
      while (a > 0 && row[a - 1] === row[i]) a--
      while (b < needles - 1 && row[b + 1] === row[i]) b++
      if (b - a + 1 > limit) marks[r * chart.width + ((offset + i) % chart.width)] = 1
    }
  }
  return marks
}

describe('long-float heat map', () => {
  it('marks the stitches a long float lies behind, across the repeat boundary (worked by hand)', () => {
    // 6 stitches repeated on 12 needles; row 3 'x.....' knits x.....x..... so its main
    // runs are 5 (between the contrast stitches) and 5 (to the right edge).
    const chart = chartFromRows(['..xxxx', 'xxxxxx', 'x.....'])
    const marks = longFloatCells(chart, { needles: 12 }, 3)
    // Row 1: contrast runs of 4 (> 3): cols 2–5 marked; main runs of 2: not.
    expect(Array.from(marks.slice(0, 6))).toEqual([0, 0, 1, 1, 1, 1])
    // Row 2 is all contrast: the main yarn knits nothing, reported elsewhere, not marked.
    expect(Array.from(marks.slice(6, 12))).toEqual([0, 0, 0, 0, 0, 0])
    // Row 3: main runs of 5 between contrast stitches: cols 1–5 marked.
    expect(Array.from(marks.slice(12, 18))).toEqual([0, 1, 1, 1, 1, 1])
    // With the limit at 5 the same row is fine.
    expect(Array.from(longFloatCells(chart, { needles: 12 }, 5).slice(12, 18))).toEqual([0, 0, 0, 0, 0, 0])
  })

  it('a run that reaches the edge of the work counts in full, but stops there', () => {
    // Needles 0–6 knit cols 0–6 of 'x......x': no wrap, so the main run is 6 long.
    const chart = chartFromRows(['x......x'])
    expect(Array.from(longFloatCells(chart, { needles: 7 }, 5))).toEqual([0, 1, 1, 1, 1, 1, 1, 0])
    expect(Array.from(longFloatCells(chart, { needles: 7 }, 6))).toEqual([0, 0, 0, 0, 0, 0, 0, 0])
  })

  it('matches a brute-force scan on random charts, needles and offsets', () => {
    fc.assert(fc.property(
      chartArb(10, 6), fc.integer({ min: 1, max: 40 }), fc.integer({ min: 0, max: 30 }), fc.integer({ min: 1, max: 8 }),
      (chart, needles, offset, limit) => {
        expect(Array.from(longFloatCells(chart, { needles, offset }, limit))).toEqual(Array.from(bruteForce(chart, needles, offset, limit)))
      },
    ), { numRuns: 500 })
  })

  it('writes row lists as a knitter counts them', () => {
    expect(rowRanges([])).toBe('')
    expect(rowRanges([0, 1, 2, 3, 8, 10, 11])).toBe('1–4, 9, 11–12')
  })
})
