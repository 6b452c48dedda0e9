import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  centredLeftmost, centredOffset, chartFromRows, needleColumns, needleInWorkLabel, needleLabel,
  parseNeedleLabel, placeMotif, repeatsAcross, stepNeedle,
} from '#shared/engine'
import { inputError, knittedRow } from './helpers'

// Bed numbering (common practice, DESIGN.md §2): needles numbered outward from the
// centre, left and right; declared: the centre lies between L1 and R1, no needle 0.
describe('needle labels', () => {
  it.each([[-12, 'L12'], [12, 'R12'], [-1, 'L1'], [1, 'R1'], [-100, 'L100']])('%i ↔ %s', (pos, label) => {
    expect(needleLabel(pos)).toBe(label)
    expect(parseNeedleLabel(label)).toBe(pos)
  })

  it('steps across the centre without a needle 0', () => {
    expect(stepNeedle(-1, 1)).toBe(1)
    expect(stepNeedle(-3, 5)).toBe(3)
    expect(stepNeedle(2, -2)).toBe(-1)
  })

  it.each([[6, 'L3', 'R3'], [7, 'L4', 'R3'], [1, 'L1', 'L1'], [200, 'L100', 'R100']])(
    '%i needles centred: %s to %s (declared: an odd one extra on the left)', (n, left, right) => {
      expect(needleLabel(centredLeftmost(n))).toBe(left)
      expect(needleInWorkLabel(0, n)).toBe(left)
      expect(needleInWorkLabel(n - 1, n)).toBe(right)
    })

  it('labels every needle in work once, in order (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 300 }), fc.integer({ min: -150, max: 150 }).filter(p => p !== 0), (n, leftmost) => {
      const labels = Array.from({ length: n }, (_, i) => parseNeedleLabel(needleInWorkLabel(i, n, { leftmost })))
      expect(new Set(labels).size).toBe(n)
      expect(labels.includes(0)).toBe(false)
      for (let i = 1; i < n; i++) expect(labels[i]! > labels[i - 1]!).toBe(true)
    }))
  })

  it.each([
    [() => needleLabel(0), 'needle position: expected a whole number other than 0, got 0'],
    [() => parseNeedleLabel('C5'), 'needle "C5": expected L or R followed by a needle number from 1, like L12'],
    [() => parseNeedleLabel('L0'), 'needle "L0": expected L or R followed by a needle number from 1, like L12'],
    [() => needleInWorkLabel(10, 10), 'needle index: must be at most 9, got 10'],
    [() => needleInWorkLabel(0, 60, { leftmost: -60, bedNeedles: 100 }), 'needles in work L60 to L1 do not fit a bed of 100 needles (L50 to R50)'],
    [() => needleInWorkLabel(0, 60, { leftmost: -9, bedNeedles: 100 }), 'needles in work L9 to R51 do not fit a bed of 100 needles (L50 to R50)'],
  ])('throws %#', (fn, message) => {
    expect(inputError(fn).message).toBe(message)
  })

  it('accepts a bed that just fits', () => {
    // L10 … R50 on a 100-needle bed: 10 left of centre, 50 right
    expect(needleInWorkLabel(59, 60, { leftmost: -10, bedNeedles: 100 })).toBe('R50')
  })
})

describe('centring the motif on the needles in work (declared: a repeat centre on the centre of the work)', () => {
  it('200 needles, 24-stitch repeat: offset 8, 7 whole repeats, 16 partial stitches each side', () => {
    expect(centredOffset(200, 24)).toBe(8)
    expect(placeMotif({ needles: 200, chartWidth: 24, bedNeedles: 200 })).toEqual({
      offset: 8, fullRepeats: 7, leftoverLeft: 16, leftoverRight: 16,
      leftmostPosition: -100, rightmostPosition: 100, leftmostLabel: 'L100', rightmostLabel: 'R100',
    })
  })

  it('fewer needles than the repeat: the middle of the motif', () => {
    expect(centredOffset(10, 24)).toBe(7) // columns 7 … 16, centre 11.5 = centre of the repeat
    expect(repeatsAcross(10, 24, 7)).toEqual({ fullRepeats: 0, leftoverLeft: 10, leftoverRight: 0 })
  })

  it.each([
    [48, 24, 0, { fullRepeats: 2, leftoverLeft: 0, leftoverRight: 0 }],
    [50, 24, 0, { fullRepeats: 2, leftoverLeft: 0, leftoverRight: 2 }],
    [50, 24, 23, { fullRepeats: 2, leftoverLeft: 1, leftoverRight: 1 }],
    [5, 4, 2, { fullRepeats: 0, leftoverLeft: 2, leftoverRight: 3 }],
  ])('repeatsAcross(%i needles, %i wide, offset %i)', (n, w, off, want) => {
    expect(repeatsAcross(n, w, off)).toEqual(want)
  })

  it('a symmetric motif knits symmetric about the centre when the counts share parity (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 16 }),
        fc.integer({ min: 1, max: 120 }),
        fc.array(fc.boolean(), { minLength: 16, maxLength: 16 }),
        (w, n0, bits) => {
          const n = n0 % 2 === w % 2 ? n0 : n0 + 1
          const row = Array.from({ length: w }, (_, c) => (bits[Math.min(c, w - 1 - c)] ? 'x' : '.')).join('')
          const chart = chartFromRows([row])
          const knitted = knittedRow(chart, 0, n, centredOffset(n, w))
          expect(knitted).toEqual([...knitted].reverse())
        },
      ),
    )
  })

  it('whole repeats and partial stitches add up to the needles (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 400 }), fc.integer({ min: 1, max: 60 }), fc.integer({ min: 0, max: 100 }), (n, w, off) => {
      const r = repeatsAcross(n, w, off)
      expect(r.leftoverLeft + r.fullRepeats * w + r.leftoverRight).toBe(n)
      expect(r.leftoverLeft).toBeLessThan(Math.max(w, 1) + (r.fullRepeats === 0 ? n : 0))
      const cols = needleColumns(w, n, off)
      if (r.fullRepeats > 0) expect(cols[r.leftoverLeft]).toBe(0)
    }))
  })
})
