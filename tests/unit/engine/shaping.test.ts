import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { describeShaping, ordinal, spaceAcrossRow, spreadShaping } from '#shared/engine'
import { inputError } from './helpers'

const intervals = (steps: { every: number; times: number }[]) =>
  steps.flatMap(s => Array.from({ length: s.times }, () => s.every)).sort((a, b) => a - b)

describe('spreadShaping — the "magic formula"', () => {
  it('36 steps over 140 rows → every 3rd row ×4 and every 4th row ×32 (Australian Knitting, "Knitting and the Magic Formula" — published)', () => {
    const steps = spreadShaping(36, 140)
    expect(intervals(steps)).toEqual([...Array(4).fill(3), ...Array(32).fill(4)])
    // Declared order: the shorter interval first.
    expect(steps).toEqual([{ every: 3, times: 4 }, { every: 4, times: 32 }])
    expect(describeShaping(steps)).toBe('every 3rd row ×4, every 4th row ×32')
  })

  it.each([
    // common practice: same formula, our own rows
    [10, 60, [{ every: 6, times: 10 }]],
    [12, 12, [{ every: 1, times: 12 }]],
    [1, 7, [{ every: 7, times: 1 }]],
    [8, 30, [{ every: 3, times: 2 }, { every: 4, times: 6 }]],
    [5, 11, [{ every: 2, times: 4 }, { every: 3, times: 1 }]],
  ])('%i steps over %i rows (common practice)', (steps, rows, want) => {
    expect(spreadShaping(steps, rows)).toEqual(want)
  })

  it('keeps totals and intervals within 1 of each other (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 500 }), fc.integer({ min: 0, max: 2000 }), (steps, extra) => {
      const rows = steps + extra
      const out = spreadShaping(steps, rows)
      expect(out.reduce((a, s) => a + s.times, 0)).toBe(steps)
      expect(out.reduce((a, s) => a + s.every * s.times, 0)).toBe(rows)
      const iv = intervals(out)
      expect(iv[iv.length - 1]! - iv[0]!).toBeLessThanOrEqual(1)
      out.forEach(s => expect(s.times).toBeGreaterThan(0))
    }))
  })

  it.each([
    [37, 36, 'steps: 37 shaping steps do not fit in 36 rows (at most one per row)'],
    [0, 10, 'steps: must be at least 1, got 0'],
    [2.5, 10, 'steps: expected a whole number, got 2.5'],
    [3, 0, 'rows: must be at least 1, got 0'],
  ])('spreadShaping(%s, %s) throws', (steps, rows, message) => {
    expect(inputError(() => spreadShaping(steps, rows)).message).toBe(message)
  })
})

describe('describeShaping and ordinals', () => {
  it.each([
    [1, '1st'], [2, '2nd'], [3, '3rd'], [4, '4th'], [11, '11th'], [12, '12th'], [13, '13th'],
    [21, '21st'], [22, '22nd'], [23, '23rd'], [100, '100th'], [101, '101st'], [111, '111th'], [112, '112th'],
  ])('ordinal(%i) = %s (English usage — common practice)', (n, s) => {
    expect(ordinal(n)).toBe(s)
  })

  it('reads an interval of 1 as "every row"', () => {
    expect(describeShaping([{ every: 1, times: 6 }, { every: 2, times: 4 }])).toBe('every row ×6, every 2nd row ×4')
  })

  it('rejects an empty list', () => {
    expect(inputError(() => describeShaping([])).message).toBe('shaping: no steps to describe')
  })
})

describe('spaceAcrossRow — declared convention: changes + 1 gaps, never at an edge', () => {
  it.each([
    // stitches, changes, groups
    [10, 2, [3, 4, 3]],
    [60, 5, [10, 10, 10, 10, 10, 10]],
    [12, 1, [6, 6]],
    [2, 1, [1, 1]],
    [7, 6, [1, 1, 1, 1, 1, 1, 1]],
    [100, 6, [14, 15, 14, 14, 14, 15, 14]],
  ])('%i stitches, %i changes → groups %j', (stitches, changes, groups) => {
    const out = spaceAcrossRow(stitches, changes)
    expect(out.groups).toEqual(groups)
    let acc = 0
    expect(out.positions).toEqual(groups.slice(0, -1).map(g => (acc += g)))
  })

  it('makes changes + 1 groups summing to the row, sizes within 1 (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 400 }), fc.integer({ min: 1, max: 399 }), (stitches, c) => {
      const changes = Math.min(c, stitches - 1)
      const { groups, positions } = spaceAcrossRow(stitches, changes)
      expect(groups).toHaveLength(changes + 1)
      expect(positions).toHaveLength(changes)
      expect(groups.reduce((a, b) => a + b, 0)).toBe(stitches)
      expect(Math.max(...groups) - Math.min(...groups)).toBeLessThanOrEqual(1)
      expect(Math.min(...groups)).toBeGreaterThanOrEqual(1)
    }))
  })

  it.each([
    [5, 5, 'changes: 5 changes need at least 6 stitches (one between each), the row has 5'],
    [5, 0, 'changes: must be at least 1, got 0'],
    [1, 1, 'stitches: must be at least 2, got 1'],
  ])('spaceAcrossRow(%i, %i) throws', (stitches, changes, message) => {
    expect(inputError(() => spaceAcrossRow(stitches, changes)).message).toBe(message)
  })
})
