import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { chartFromRows, chooseCatchNeedles } from '#shared/engine'
import type { Chart } from '#shared/engine'
import { chartArb, floatRuns, inputError, knittedRow } from './helpers'

// Brute force: with these needles knitting every row, is every float of a
// used yarn ≤ limit? A caught stitch splits a float and belongs to neither side.
function catchesAll(chart: Chart, needles: number, offset: number, limit: number, caught: Set<number>): boolean {
  for (let r = 0; r < chart.height; r++) {
    const colours = knittedRow(chart, r, needles, offset)
    for (const k of [0, 1]) {
      if (!colours.includes(k)) continue // yarn unused in this row: nothing to catch
      if (floatRuns(colours, k, caught).some(L => L > limit)) return false
    }
  }
  return true
}

// Smallest working set size by trying every subset of needles.
function exhaustiveMinimum(chart: Chart, needles: number, offset: number, limit: number): number {
  let best = needles
  for (let mask = 0; mask < 1 << needles; mask++) {
    let size = 0
    for (let m = mask; m; m &= m - 1) size++
    if (size >= best) continue
    const set = new Set<number>()
    for (let i = 0; i < needles; i++) if (mask & (1 << i)) set.add(i)
    if (catchesAll(chart, needles, offset, limit, set)) best = size
  }
  return best
}

describe('chooseCatchNeedles — hand-worked examples (common practice)', () => {
  it('catches nothing when every float is within the limit', () => {
    expect(chooseCatchNeedles(chartFromRows(['x..x..']), { needles: 12 }, 2)).toEqual([])
  })

  it('catches one float of 7 in its 6th stitch: sides of 5 and 1', () => {
    // contrast floats over needles 1–7; greedy catches the right end of the first window of 6
    expect(chooseCatchNeedles(chartFromRows(['x.......x']), { needles: 9 }, 5)).toEqual([6])
  })

  it('needs two catches for a float longer than 2 × limit + 1', () => {
    // main floats over 12 contrast stitches between two main ones; limit 3 → catches at 4, 8, 12
    const chart = chartFromRows(['.xxxxxxxxxxxx.'])
    const caught = chooseCatchNeedles(chart, { needles: 14 }, 3)
    expect(caught).toEqual([4, 8, 12])
  })

  it('ignores a yarn in a row where it knits nothing (it is cut, not caught)', () => {
    expect(chooseCatchNeedles(chartFromRows(['..........']), { needles: 10 }, 2)).toEqual([])
  })

  it('returns nothing when the limit covers the whole width', () => {
    expect(chooseCatchNeedles(chartFromRows(['x.......']), { needles: 8 }, 8)).toEqual([])
  })

  it.each([[0], [-1], [1.5], [Number.NaN]])('limit %s throws', (limit) => {
    const e = inputError(() => chooseCatchNeedles(chartFromRows(['x..']), { needles: 3 }, limit))
    expect(e.field).toBe('limit')
    expect(e.message).toMatch(/^limit: /)
  })
})

describe('chooseCatchNeedles — properties', () => {
  it('always leaves every float of a used yarn within the limit, ascending and in range', () => {
    fc.assert(fc.property(
      chartArb(12, 6), fc.integer({ min: 1, max: 60 }), fc.integer({ min: 0, max: 20 }), fc.integer({ min: 1, max: 6 }),
      (chart, needles, offset, limit) => {
        const caught = chooseCatchNeedles(chart, { needles, offset }, limit)
        expect(caught).toEqual([...caught].sort((a, b) => a - b))
        expect(new Set(caught).size).toBe(caught.length)
        caught.forEach(c => expect(c >= 0 && c < needles).toBe(true))
        expect(catchesAll(chart, needles, offset, limit, new Set(caught))).toBe(true)
      },
    ), { numRuns: 500 })
  })

  it('is the exact minimum: no smaller set works (exhaustive over all subsets, needles ≤ 12)', () => {
    fc.assert(fc.property(
      chartArb(8, 5), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 0, max: 10 }), fc.integer({ min: 1, max: 4 }),
      (chart, needles, offset, limit) => {
        const caught = chooseCatchNeedles(chart, { needles, offset }, limit)
        expect(caught.length).toBe(exhaustiveMinimum(chart, needles, offset, limit))
      },
    ), { numRuns: 150 })
  })
})
