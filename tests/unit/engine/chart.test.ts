import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { assertChart, chartFromRows, chartToRows, createChart, KnittingInputError } from '#shared/engine'

function thrown(fn: () => unknown): KnittingInputError {
  try { fn() }
  catch (e) {
    expect(e).toBeInstanceOf(KnittingInputError)
    return e as KnittingInputError
  }
  throw new Error('expected a KnittingInputError')
}

describe('chartFromRows / chartToRows', () => {
  it('reads rows[0] as the first row knitted and column 0 as the leftmost stitch', () => {
    const chart = chartFromRows(['x..', '.#.'])
    expect(chart.width).toBe(3)
    expect(chart.height).toBe(2)
    expect(Array.from(chart.cells)).toEqual([1, 0, 0, 0, 1, 0])
  })

  it.each([
    ['.', 0], ['0', 0], ['x', 1], ['X', 1], ['#', 1], ['1', 1],
  ])('character %j is colour %i', (ch, colour) => {
    expect(chartFromRows([ch]).cells[0]).toBe(colour)
  })

  it('writes "." and "x"', () => {
    expect(chartToRows(chartFromRows(['0X#1', '.x.x']))).toEqual(['.xxx', '.x.x'])
  })

  it('round-trips any chart (property)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 30 }), fc.integer({ min: 1, max: 30 }), fc.infiniteStream(fc.boolean()),
      (w, h, bits) => {
        const rows = Array.from({ length: h }, () => Array.from({ length: w }, () => bits.next().value ? 'x' : '.').join(''))
        const chart = chartFromRows(rows)
        expect(chartToRows(chart)).toEqual(rows)
        expect(chartFromRows(chartToRows(chart))).toEqual(chart)
      },
    ))
  })

  it.each([
    [[], 'chart: no rows', undefined, undefined],
    [['..', ''], 'chart row 2: empty row', 2, undefined],
    [['...', '..'], 'chart row 2: 2 stitches, expected 3 like row 1', 2, 3],
    [['..', '...'], 'chart row 2: 3 stitches, expected 2 like row 1', 2, 3],
    [['....', '....', '..q.'], 'chart row 3, column 3: unexpected character "q"', 3, 3],
    [['x.x.x.q'], 'chart row 1, column 7: unexpected character "q"', 1, 7],
    [['. .'], 'chart row 1, column 2: unexpected character " "', 1, 2],
    [['..🧶'], 'chart row 1, column 3: unexpected character "🧶"', 1, 3],
  ])('rejects %j: %s', (rows, message, row, col) => {
    const e = thrown(() => chartFromRows(rows as string[]))
    expect(e.message.startsWith(message)).toBe(true)
    expect(e.field).toBe('chart')
    expect(e.row).toBe(row)
    expect(e.col).toBe(col)
  })

  it('rejects a row that is not text', () => {
    expect(thrown(() => chartFromRows(['..', 3 as unknown as string])).message).toBe('chart row 2: expected text')
  })
})

describe('assertChart', () => {
  it('accepts a well-formed chart', () => {
    expect(() => assertChart(createChart(3, 2, 1))).not.toThrow()
  })
  it.each([
    [{ width: 0, height: 1, cells: new Uint8Array(0) }, 'width must be a whole number'],
    [{ width: 2.5, height: 1, cells: new Uint8Array(2) }, 'width must be a whole number'],
    [{ width: 2, height: 2, cells: new Uint8Array(3) }, '3 cells, expected 4'],
    [{ width: 2, height: 1, cells: [0, 1] }, 'cells must be a Uint8Array'],
    [{ width: 2, height: 2, cells: Uint8Array.from([0, 1, 1, 2]) }, 'chart row 2, column 2: colour must be 0 or 1, got 2'],
    [null, 'expected a chart'],
  ])('rejects %o', (chart, message) => {
    expect(thrown(() => assertChart(chart)).message).toContain(message)
  })
})
