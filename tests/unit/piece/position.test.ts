import { describe, expect, it } from 'vitest'
import { compilePieceTimeline } from '#shared/piece/timeline'
import { cuesForStep, knitPosition } from '#shared/piece/position'
import { describeDuration, msPerRow } from '#shared/piece/pace'
import type { PieceTimeline } from '#shared/piece/types'

// A small piece worked by hand: 4 plain rows in A, a 2-row motif knitted for 3 chart rows
// colour by colour (2 passes per colour: A A B B per chart row), 2 plain rows in A.
const yarns = [
  { slot: 'A', name: 'Cream', hex: '#efe6d2', symbol: '●' },
  { slot: 'B', name: 'Ink blue', hex: '#1d2f5a', symbol: '▲' },
]
const timeline: PieceTimeline = {
  technique: 'colour-by-colour',
  passesPerColour: 2,
  needles: 20,
  yarns,
  sections: [
    { kind: 'plain', label: 'Welt', rows: 4, yarn: 'A' },
    { kind: 'motif', label: 'Band', motifName: 'Dots', chart: ['x.', '.x'], chartRows: 3, main: 'A', contrast: 'B' },
    { kind: 'plain', label: 'Top band', rows: 2, yarn: 'A' },
  ],
}
const compiled = compilePieceTimeline(timeline)
// Rows (1-based): 1–4 welt A; 5,6 A; 7,8 B; 9,10 A; 11,12 B; 13,14 A; 15,16 B; 17,18 top band A.

describe('knitPosition (worked by hand from the timeline above)', () => {
  it('at the start: row 1, pair 1, welt, Cream, change after 6 rows', () => {
    const p = knitPosition(timeline, compiled, 0)
    expect(p.totalRows).toBe(18)
    expect(p.row).toBe(1)
    expect(p.stepRows).toEqual([1, 2])
    expect(p.pair).toBe(1)
    expect(p.section).toMatchObject({ index: 0, label: 'Welt', row: 1, rows: 4, pair: 1, pairs: 2, chartRow: null })
    expect(p.yarns.map(y => y.name)).toEqual(['Cream'])
    expect(p.changeNow).toBe(false)
    expect(p.rowsToChange).toBe(6) // first change: row 7 (index 6), to Ink blue
    expect(p.changeRow).toBe(7)
    expect(p.nextYarns.map(y => y.name)).toEqual(['Ink blue'])
    expect(p.upcoming).toMatchObject({ row: 5, rowsAway: 4, kind: 'section' })
    expect(p.upcoming!.text).toContain('Band · Dots')
  })

  it('inside the motif: chart row and pass pair counted within the section', () => {
    const p = knitPosition(timeline, compiled, 8) // knitting row 9: chart row 2, main passes
    expect(p.row).toBe(9)
    expect(p.pair).toBe(5)
    expect(p.section).toMatchObject({ index: 1, row: 5, rows: 12, pair: 3, pairs: 6, chartRow: 2, chartHeight: 2 })
    expect(p.yarns.map(y => y.slot)).toEqual(['A'])
    expect(p.changeNow).toBe(true) // rows 7–8 were Ink blue
    expect(p.rowsToChange).toBe(2)
    expect(p.nextYarns.map(y => y.slot)).toEqual(['B'])
  })

  it('on a change row: change now, then count to the change after it; the last section has none', () => {
    expect(knitPosition(timeline, compiled, 6)).toMatchObject({ changeNow: true, rowsToChange: 2, changeRow: 9 })
    expect(knitPosition(timeline, compiled, 7)).toMatchObject({ changeNow: false, rowsToChange: 1 })
    const last = knitPosition(timeline, compiled, 16)
    expect(last.section!.label).toBe('Top band')
    expect(last.changeNow).toBe(true)
    expect(last.rowsToChange).toBeNull()
    expect(last.upcoming).toMatchObject({ kind: 'end', row: 18, rowsAway: 2 })
  })

  it('one-row steps, the last odd row, and a finished piece', () => {
    expect(knitPosition(timeline, compiled, 3, 1).stepRows).toEqual([4, 4])
    expect(knitPosition(timeline, compiled, 17).stepRows).toEqual([18, 18])
    const done = knitPosition(timeline, compiled, 18)
    expect(done.finished).toBe(true)
    expect(done.row).toBeNull()
  })
})

describe('cuesForStep', () => {
  it('rings on the last row pair before a change (ahead = 2), once', () => {
    expect(cuesForStep(compiled, timeline, 0, 2, 2)).toEqual([]) // rows 1–2 knitted; change at row 7 is 4 rows away
    expect(cuesForStep(compiled, timeline, 2, 4, 2)).toEqual(['change', 'section']) // now 2 rows before it; section starts at row 5
    expect(cuesForStep(compiled, timeline, 4, 6, 2)).toEqual(['change']) // row 9 (index 8) is 2 rows away
  })
  it('ends the piece and never rings backwards', () => {
    expect(cuesForStep(compiled, timeline, 16, 18, 2)).toEqual(['end'])
    expect(cuesForStep(compiled, timeline, 6, 4, 2)).toEqual([])
  })
})

describe('pace', () => {
  const t0 = Date.parse('2026-12-01T10:00:00Z')
  it('is the median seconds per row, leaving out pauses', () => {
    const steps = [0, 60, 120, 180, 240, 3600, 3660].map(s => ({ at: t0 + s * 1000, rows: 2 }))
    expect(msPerRow(steps)).toBe(30_000) // 60 s per row pair; the 56-minute break is left out
    expect(msPerRow(steps.slice(0, 3))).toBeNull()
  })
  it.each([
    [20_000, 'under a minute'],
    [12 * 60_000, 'about 12 min'],
    [100 * 60_000, 'about 1 h 40 min'],
    [120 * 60_000, 'about 2 h'],
  ])('describes %d ms as %s', (ms, text) => {
    expect(describeDuration(ms)).toBe(text)
  })
})
