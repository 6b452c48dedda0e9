import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { analyseFloats, chartFromRows, createChart, floatVerdict } from '#shared/engine'
import type { Chart, Colour } from '#shared/engine'
import { chartArb, floatRuns, inputError, knittedRow } from './helpers'

// Brute-force reference: build each knitted row, list every run, take maxima.
function reference(chart: Chart, needles: number, offset: number, limit: number) {
  const rows = []
  const maxFloat: [number, number] = [0, 0]
  const longRows: number[] = []
  for (let r = 0; r < chart.height; r++) {
    const colours = knittedRow(chart, r, needles, offset)
    let unused: Colour | null = null
    const rowMax: [number, number] = [0, 0]
    for (const k of [0, 1] as const) {
      if (!colours.includes(k)) { unused = k; continue }
    }
    if (unused === null) {
      for (const k of [0, 1] as const) rowMax[k] = Math.max(0, ...floatRuns(colours, k))
    }
    maxFloat[0] = Math.max(maxFloat[0], rowMax[0])
    maxFloat[1] = Math.max(maxFloat[1], rowMax[1])
    if (rowMax[0] > limit || rowMax[1] > limit) longRows.push(r)
    rows.push({ maxFloat: rowMax, unused })
  }
  const longest = Math.max(...maxFloat)
  const verdict = longest <= 3 ? 'tidy' : longest <= 5 ? 'moderate' : 'long'
  return { maxFloat, rows, longRows, verdict }
}

describe('analyseFloats — hand-worked examples (common practice: a float is the run of stitches a yarn skips)', () => {
  it('counts each yarn behind the other colour', () => {
    const a = analyseFloats(chartFromRows(['x...x']), { needles: 5 })
    expect(a.maxFloat).toEqual([1, 3]) // main skips single contrast stitches; contrast skips 3 main
    expect(a.rows).toEqual([{ maxFloat: [1, 3], unused: null }])
    expect(a.verdict).toBe('tidy')
    expect(a.longRows).toEqual([])
  })

  it('joins runs across the repeat boundary', () => {
    // .x.. repeated over 8 needles: . x . . | . x . .  → main run of 3 across the boundary
    const a = analyseFloats(chartFromRows(['.x..']), { needles: 8 })
    expect(a.maxFloat).toEqual([1, 3])
  })

  it('uses the offset: needle i knits column (offset + i) mod width', () => {
    // offset 2 over 8 needles reads columns 2 3 0 1 2 3 0 1 of "x..." → . . x . . . x .
    const a = analyseFloats(chartFromRows(['x...']), { needles: 8, offset: 2 })
    expect(a.rows[0]!.maxFloat).toEqual([1, 3])
    const b = analyseFloats(chartFromRows(['x...']), { needles: 8, offset: 6 })
    // columns 2 3 0 1 … again (6 mod 4 = 2)
    expect(b.rows).toEqual(a.rows)
  })

  it('counts runs reaching the edge of the needles in work, not beyond it', () => {
    const a = analyseFloats(chartFromRows(['x.......']), { needles: 8 })
    expect(a.maxFloat).toEqual([1, 7])
    expect(a.verdict).toBe('long')
    expect(a.longRows).toEqual([0])
    // The same motif on 4 needles stops at the edge: contrast floats 3.
    expect(analyseFloats(chartFromRows(['x.......']), { needles: 4 }).maxFloat).toEqual([1, 3])
  })

  it('reports a row where a yarn knits nothing as unused and leaves it out of the maxima', () => {
    const a = analyseFloats(chartFromRows(['........', 'x...x...', 'xxxxxxxx']), { needles: 8 })
    expect(a.rows).toEqual([
      { maxFloat: [0, 0], unused: 1 },
      { maxFloat: [1, 3], unused: null },
      { maxFloat: [0, 0], unused: 0 },
    ])
    expect(a.maxFloat).toEqual([1, 3])
    expect(a.unusedRows).toEqual([[2], [0]])
    expect(a.longRows).toEqual([])
  })

  it('judges unused within the needles in work, not the whole chart row', () => {
    const a = analyseFloats(chartFromRows(['...x']), { needles: 3 })
    expect(a.rows[0]).toEqual({ maxFloat: [0, 0], unused: 1 })
  })

  it('lists rows over the limit and gives mm from the stitch width', () => {
    const chart = chartFromRows(['x.....', 'x..x..', 'xxxxx.'])
    const a = analyseFloats(chart, { needles: 6 }, { limit: 4, stitchWidthMm: 4.5 })
    expect(a.maxFloat).toEqual([5, 5])
    expect(a.longRows).toEqual([0, 2])
    expect(a.maxFloatMm).toEqual([22.5, 22.5])
    expect(a.limit).toBe(4)
    expect(analyseFloats(chart, { needles: 6 }).maxFloatMm).toBeUndefined()
  })

  it.each([
    [0, 'tidy'], [1, 'tidy'], [3, 'tidy'], [4, 'moderate'], [5, 'moderate'], [6, 'long'], [40, 'long'],
  ])('longest float %i stitches → %s (common practice: ≤3 tidy, ≥6 long)', (n, verdict) => {
    expect(floatVerdict(n)).toBe(verdict)
  })
})

describe('analyseFloats — against a brute-force per-stitch scan (property)', () => {
  it('agrees on maxima, rows, unused, longRows and verdict', () => {
    fc.assert(fc.property(
      chartArb(10, 6), fc.integer({ min: 1, max: 40 }), fc.integer({ min: 0, max: 30 }), fc.integer({ min: 1, max: 8 }),
      (chart, needles, offset, limit) => {
        const got = analyseFloats(chart, { needles, offset }, { limit })
        const want = reference(chart, needles, offset, limit)
        expect(got.maxFloat).toEqual(want.maxFloat)
        expect(got.rows).toEqual(want.rows)
        expect(got.longRows).toEqual(want.longRows)
        expect(got.verdict).toBe(want.verdict)
      },
    ), { numRuns: 500 })
  })
})

describe('analyseFloats — invalid input', () => {
  const chart = createChart(4, 2)
  it.each([
    [{ needles: 0 }, {}, 'placement.needles: must be at least 1, got 0'],
    [{ needles: 2.5 }, {}, 'placement.needles: expected a whole number, got 2.5'],
    [{ needles: 5000 }, {}, 'placement.needles: must be at most 1000, got 5000'],
    [{ needles: 4, offset: -1 }, {}, 'placement.offset: must be at least 0, got -1'],
    [{ needles: 4 }, { limit: 0 }, 'limit: must be at least 1, got 0'],
    [{ needles: 4 }, { limit: 2.5 }, 'limit: expected a whole number, got 2.5'],
    [{ needles: 4 }, { stitchWidthMm: 0 }, 'stitchWidthMm: must be greater than 0, got 0'],
    [{ needles: 4 }, { stitchWidthMm: Number.NaN }, 'stitchWidthMm: expected a number, got NaN'],
  ])('placement %o options %o: %s', (placement, opts, message) => {
    const e = inputError(() => analyseFloats(chart, placement, opts))
    expect(e.message).toBe(message)
    expect(e.field).toBe(message.split(':')[0])
  })
  it('rejects a malformed chart', () => {
    expect(() => analyseFloats({ width: 2, height: 1, cells: Uint8Array.from([0, 3]) }, { needles: 2 }))
      .toThrow('chart row 1, column 2: colour must be 0 or 1, got 3')
  })
})
