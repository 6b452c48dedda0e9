import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { chartFromRows, chartToRows,
  cellsBetween, createHistory, fillColumn, fillRow, invertChart, mirrorChart, recordHistory, redoHistory,
  resizeChart, shiftChart, undoHistory } from '#shared/engine'
import type { Chart } from '#shared/engine'
import { useMotifEditor } from '../../../composables/useMotifEditor'
import { chartArb } from './helpers'

// The editor's tools, worked by hand on small charts (rows[0] is the first row knitted,
// drawn at the bottom), then checked as properties on random charts.
const rows = (chart: Chart) => chartToRows(chart)
const pebble = chartFromRows(['x...', '..x.', 'xx..'])

describe('editor tools', () => {
  it('inverts every stitch', () => {
    expect(rows(invertChart(pebble))).toEqual(['.xxx', 'xx.x', '..xx'])
  })
  it('mirrors left and right, keeping the rows in order', () => {
    expect(rows(mirrorChart(pebble))).toEqual(['...x', '.x..', '..xx'])
  })
  it('shifts by one stitch right and left, wrapping at the edges', () => {
    expect(rows(shiftChart(pebble, 1, 0))).toEqual(['.x..', '...x', '.xx.'])
    expect(rows(shiftChart(pebble, -1, 0))).toEqual(['...x', '.x..', 'x..x'])
  })
  it('shifts by one row up and down, wrapping top to bottom', () => {
    // Up: the first row knitted moves to the second, the top row comes round to the bottom.
    expect(rows(shiftChart(pebble, 0, 1))).toEqual(['xx..', 'x...', '..x.'])
    expect(rows(shiftChart(pebble, 0, -1))).toEqual(['..x.', 'xx..', 'x...'])
  })
  it('resizes keeping the bottom-left corner; new stitches are main colour', () => {
    expect(rows(resizeChart(pebble, 2, 2))).toEqual(['x.', '..'])
    expect(rows(resizeChart(pebble, 5, 4))).toEqual(['x....', '..x..', 'xx...', '.....'])
  })
  it('fills one row or one column', () => {
    expect(rows(fillRow(pebble, 1, 1))).toEqual(['x...', 'xxxx', 'xx..'])
    expect(rows(fillColumn(pebble, 0, 0))).toEqual(['....', '..x.', '.x..'])
    expect(rows(pebble)).toEqual(['x...', '..x.', 'xx..']) // the original is untouched
  })
  it('lists every cell between two cells, so a quick drag leaves no gaps', () => {
    expect(cellsBetween({ row: 0, col: 0 }, { row: 2, col: 4 })).toEqual([
      { row: 0, col: 0 }, { row: 1, col: 1 }, { row: 1, col: 2 }, { row: 2, col: 3 }, { row: 2, col: 4 },
    ])
    expect(cellsBetween({ row: 3, col: 3 }, { row: 3, col: 3 })).toEqual([{ row: 3, col: 3 }])
  })

  it('properties: invert and mirror undo themselves; a full shift is no shift; shifts add up', () => {
    fc.assert(fc.property(chartArb(9, 7), fc.integer({ min: -20, max: 20 }), fc.integer({ min: -20, max: 20 }), (chart, a, b) => {
      expect(rows(invertChart(invertChart(chart)))).toEqual(rows(chart))
      expect(rows(mirrorChart(mirrorChart(chart)))).toEqual(rows(chart))
      expect(rows(shiftChart(chart, chart.width, chart.height))).toEqual(rows(chart))
      expect(rows(shiftChart(shiftChart(chart, a, b), -a, -b))).toEqual(rows(chart))
      expect(rows(shiftChart(shiftChart(chart, a, 0), 0, b))).toEqual(rows(shiftChart(chart, a, b)))
    }))
  })
  it('property: growing then shrinking back gives the same chart; the bottom-left block is kept', () => {
    fc.assert(fc.property(chartArb(9, 7), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 12 }), (chart, w, h) => {
      const grown = resizeChart(chart, chart.width + w, chart.height + h)
      expect(rows(resizeChart(grown, chart.width, chart.height))).toEqual(rows(chart))
      const small = resizeChart(chart, w, h)
      for (let r = 0; r < Math.min(h, chart.height); r++) {
        for (let c = 0; c < Math.min(w, chart.width); c++) expect(small.cells[r * w + c]).toBe(chart.cells[r * chart.width + c])
      }
    }))
  })
})

describe('undo history', () => {
  const chartOf = (n: number) => chartFromRows([n.toString(2).padStart(4, '0').replace(/0/g, '.').replace(/1/g, 'x')])

  it('keeps at most its limit of steps, dropping the oldest', () => {
    let h = createHistory(3)
    for (let i = 0; i < 5; i++) h = recordHistory(h, chartOf(i))
    expect(h.past.map(c => rows(c)[0])).toEqual([rows(chartOf(2))[0], rows(chartOf(3))[0], rows(chartOf(4))[0]])
  })
  it('undoes to the oldest kept step and no further; redo walks forward again; a new change clears redo', () => {
    let h = createHistory(2)
    let current = chartOf(0)
    for (let i = 1; i <= 4; i++) { h = recordHistory(h, current); current = chartOf(i) }
    const seen: string[] = []
    for (let step = undoHistory(h, current); step; step = undoHistory(h, current)) {
      h = step.history; current = step.chart; seen.push(rows(current)[0]!)
    }
    expect(seen).toEqual([rows(chartOf(3))[0], rows(chartOf(2))[0]])
    expect(undoHistory(h, current)).toBeNull()
    const redone = redoHistory(h, current)!
    expect(rows(redone.chart)).toEqual(rows(chartOf(3)))
    h = recordHistory(redone.history, redone.chart)
    expect(redoHistory(h, chartOf(9))).toBeNull()
  })

  it('the editor makes one undo step per stroke and per tool', () => {
    const editor = useMotifEditor(['....', '....'], { historyLimit: 10 })
    editor.beginStroke()
    editor.paint(0, 0, 1)
    editor.paint(0, 1, 1)
    editor.paint(9, 9, 1) // off the chart: ignored
    editor.endStroke()
    editor.invert()
    expect(editor.rows()).toEqual(['..xx', 'xxxx'])
    editor.undo()
    expect(editor.rows()).toEqual(['xx..', '....'])
    editor.undo()
    expect(editor.rows()).toEqual(['....', '....'])
    expect(editor.canUndo.value).toBe(false)
    editor.redo(); editor.redo()
    expect(editor.rows()).toEqual(['..xx', 'xxxx'])
    expect(editor.canRedo.value).toBe(false)
    editor.resize(2, 3)
    expect(editor.rows()).toEqual(['..', 'xx', '..'])
  })
})
