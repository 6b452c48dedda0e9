import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { combineChartRows } from '#shared/engine'

// Combining two edits of one chart (our own rule, no outside source): stitches I changed keep
// mine, all others take theirs; the sizes must agree.
describe('combineChartRows', () => {
  it.each([
    ['only I changed', ['....'], ['x...'], ['....'], ['x...'], [1, 0]],
    ['only they changed', ['....'], ['....'], ['...x'], ['...x'], [0, 1]],
    ['different stitches', ['....', 'xxxx'], ['x...', 'xxxx'], ['....', 'xx.x'], ['x...', 'xx.x'], [1, 1]],
    ['the same stitch (two colours: the same way)', ['x...'], ['....'], ['....'], ['....'], [1, 1]],
    ['a row each', ['..', '..', '..'], ['xx', '..', '..'], ['..', '..', 'x.'], ['xx', '..', 'x.'], [2, 1]],
  ])('%s', (_, base, mine, theirs, rows, [m, t]) => {
    expect(combineChartRows(base, mine, theirs)).toEqual({ rows, mine: m, theirs: t })
  })

  it.each([
    ['mine is wider', ['..'], ['...'], ['..']],
    ['theirs has another row', ['..'], ['..'], ['..', '..']],
    ['an empty chart', [], [], []],
  ])('is null when the sizes differ: %s', (_, base, mine, theirs) => {
    expect(combineChartRows(base, mine, theirs)).toBeNull()
  })

  it('keeps every change of mine and every change of theirs (brute force over small charts)', () => {
    const cell = fc.constantFrom('.', 'x')
    const chart = fc.tuple(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 6 })).chain(([w, h]) =>
      fc.tuple(...[0, 1, 2].map(() => fc.array(fc.array(cell, { minLength: w, maxLength: w }).map(r => r.join('')), { minLength: h, maxLength: h }))))
    fc.assert(fc.property(chart, ([base, mine, theirs]) => {
      const out = combineChartRows(base!, mine!, theirs!)!
      base!.forEach((row, r) => [...row].forEach((was, c) => {
        if (mine![r]![c] !== was) expect(out.rows[r]![c]).toBe(mine![r]![c])
        else if (theirs![r]![c] !== was) expect(out.rows[r]![c]).toBe(theirs![r]![c])
        else expect(out.rows[r]![c]).toBe(was)
      }))
      expect(combineChartRows(base!, mine!, base!)!.rows).toEqual(mine)
      expect(combineChartRows(base!, base!, theirs!)!.rows).toEqual(theirs)
    }))
  })
})
