import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { chartFromRows, compilePlan, estimateRowsYarn, estimateYarn } from '#shared/engine'
import type { KnittedRow } from '#shared/engine'

const common = { swatch: { stitches: 40 * 50, grams: 20 }, needlePitchMm: 4.5, yarns: { A: { metresPer100g: 400 }, B: { metresPer100g: 300 } } }

describe('estimateRowsYarn — every row at its real width', () => {
  it('a worked example: two narrowing rows of a 2-stitch check fixed to the bed', () => {
    // Chart "x." (column 0 contrast), offset 0: needle n is contrast when n is even.
    // Row 1 knits needles 0–5: contrast on 0, 2, 4 → A 3, B 3; A floats past 3, B past 3.
    // Row 2 knits needles 1–4 (decreased 1 each end): contrast on 2, 4 → A 2, B 2.
    // Row 3 plain A on needles 1–4: A 4.  Totals A 9 stitches, 5 floated; B 5 stitches, 5 floated.
    const chart = chartFromRows(['x.'])
    const rows: KnittedRow[] = [
      { knitFrom: 0, knitTo: 6, yarns: ['A', 'B'], chart, chartRow: 0, offset: 0 },
      { knitFrom: 1, knitTo: 5, yarns: ['A', 'B'], chart, chartRow: 0, offset: 0 },
      { knitFrom: 1, knitTo: 5, yarns: ['A'] },
      { knitFrom: 3, knitTo: 3, yarns: ['A'] }, // all cast off: nothing knitted
    ]
    const e = estimateRowsYarn({ ...common, rows })
    const a = e.yarns.find(y => y.yarn === 'A')!
    const b = e.yarns.find(y => y.yarn === 'B')!
    expect([a.stitches, a.floatStitches, b.stitches, b.floatStitches]).toEqual([9, 5, 5, 5])
    expect(a.stitchGrams).toBeCloseTo(9 * 20 / 2000, 10)
    expect(b.floatMm).toBeCloseTo(5 * 4.5, 10)
  })

  it('a rectangle row by row gives estimateYarn\'s answer (together, any offset)', () => {
    const rowsArb = fc.array(fc.stringMatching(/^[.x]{1,6}$/), { minLength: 1, maxLength: 5 })
      .filter(r => r.every(x => x.length === r[0]!.length))
    const ints = [fc.integer({ min: 1, max: 40 }), fc.integer({ min: 0, max: 9 }), fc.integer({ min: 1, max: 12 })] as const
    fc.assert(fc.property(rowsArb, ...ints, (chartRows, needles, offset, n) => {
      const chart = chartFromRows(chartRows)
      const plan = { technique: 'together' as const, sections: [{ kind: 'plain' as const, rows: 2, yarn: 'A' }, { kind: 'motif' as const, chart, chartRows: n, main: 'A', contrast: 'B' }] }
      const whole = estimateYarn({ ...common, plan, placement: { needles, offset } })
      const rows = compilePlan(plan).rows.map((r): KnittedRow => ({
        knitFrom: 0, knitTo: needles, yarns: r.yarns, chart: r.chartRow === null ? undefined : chart, chartRow: r.chartRow ?? undefined, offset,
      }))
      const byRow = estimateRowsYarn({ ...common, rows })
      expect(byRow.yarns.map(y => [y.yarn, y.stitches, y.floatStitches])).toEqual(whole.yarns.map(y => [y.yarn, y.stitches, y.floatStitches]))
    }), { numRuns: 200 })
  })

  it('a row without a yarn is refused by name', () => {
    expect(() => estimateRowsYarn({ ...common, rows: [{ knitFrom: 0, knitTo: 2, yarns: [] }] })).toThrow(/rows\[0\]\.yarns/)
  })
})
