// Where the knitter is in a piece, in the words the knit view shows: the row being knitted,
// its row pair, the section, the yarn in the feeder, how far to the next colour change, and
// what comes up next. Pure: the same answer on the tablet offline and in tests.

import type { CompiledPlan } from '#shared/engine'
import { cardRowAt, type CardRowAt } from '#shared/piece/cardRow'
import type { PieceSection, PieceTimeline, SlotYarn } from '#shared/piece/types'

export interface KnitPosition {
  totalRows: number
  completedRows: number
  finished: boolean
  /** 1-based machine row now being knitted (null once finished). */
  row: number | null
  /** The rows the next step covers: [first, last], 1-based (one row, or a row pair). */
  stepRows: [number, number] | null
  /** 1-based row pair in the piece (rows 1–2 are pair 1). */
  pair: number | null
  totalPairs: number
  section: null | {
    index: number
    count: number
    label: string
    kind: PieceSection['kind']
    /** 1-based row within the section and the section's length in machine rows. */
    row: number
    rows: number
    pair: number
    pairs: number
    /** For motif sections: 1-based chart row and chart height. */
    chartRow: number | null
    chartHeight: number | null
  }
  /** Yarns in the feeder for the current row (main first in a 'together' row). */
  yarns: SlotYarn[]
  /** The yarns change on the current row: the knitter changes yarn before knitting it. */
  changeNow: boolean
  /** Rows from the current row to the next row (after it) where the yarns change, or null if they never do again. */
  rowsToChange: number | null
  /** 1-based row at which the yarns next change, and the yarns then. */
  changeRow: number | null
  nextYarns: SlotYarn[]
  /** The next thing the knitter must do besides knitting on; `cardLock`: the card row to lock at the reader there. */
  upcoming: null | { row: number; rowsAway: number; kind: 'section' | 'end'; text: string; cardLock?: number }
  /** The punch card row of the current row, with the machine's card (null on plain rows or without one). */
  card: CardRowAt | null
}

/**
 * The stretches of rows that knit one section, in knitting order: a section is one stretch in a
 * rectangle; in a shaped piece the left of the neck knits the top sections again, as new stretches.
 * A stretch starts where the section changes or its row count starts again (rowInSection 0).
 */
function sectionRuns(compiled: CompiledPlan) {
  const runs: { section: number; start: number; rows: number }[] = []
  const runOf = new Int32Array(compiled.rows.length)
  compiled.rows.forEach((r, i) => {
    const last = runs[runs.length - 1]
    if (!last || last.section !== r.section || r.rowInSection === 0) runs.push({ section: r.section, start: i, rows: 0 })
    runs[runs.length - 1]!.rows++
    runOf[i] = runs.length - 1
  })
  return { runs, runOf }
}

function describeSection(s: PieceSection, rows: number, yarns: Map<string, SlotYarn>) {
  if (s.kind === 'plain') return `${s.label} · ${rows} rows in ${yarns.get(s.yarn)?.name ?? s.yarn}`
  const name = s.label === s.motifName ? s.label : `${s.label} · ${s.motifName}`
  return `${name} · ${rows} rows in ${yarns.get(s.main)?.name ?? s.main} and ${yarns.get(s.contrast)?.name ?? s.contrast}`
}

/**
 * The last row (1-based) of the step from `done` completed rows: `step` rows on, but never past
 * the end of a part of a shaped piece, so the side of the neck is finished before the other
 * begins (the carriage and the held needles change there).
 */
function stepEnd(timeline: PieceTimeline, done: number, step: number, totalRows: number): number {
  const end = Math.min(done + step, totalRows)
  const parts = timeline.shape?.rows
  if (!parts) return end
  for (let r = done + 1; r < end; r++) if (parts[r]?.part !== parts[done]?.part) return r
  return end
}

export function knitPosition(timeline: PieceTimeline, compiled: CompiledPlan, completedRows: number, step: 1 | 2 = 2): KnitPosition {
  const totalRows = compiled.rows.length
  const done = Math.max(0, Math.min(completedRows, totalRows))
  const yarnBySlot = new Map(timeline.yarns.map(y => [y.slot, y]))
  const pick = (slots: string[]) => slots.map(s => yarnBySlot.get(s) ?? { slot: s, name: s, hex: '#888888', symbol: '?' })
  const { runs, runOf } = sectionRuns(compiled)
  const base = { totalRows, completedRows: done, totalPairs: Math.ceil(totalRows / 2) }
  if (done >= totalRows) {
    return {
      ...base,
      finished: true,
      row: null,
      stepRows: null,
      pair: null,
      section: null,
      yarns: [],
      changeNow: false,
      rowsToChange: null,
      changeRow: null,
      nextYarns: [],
      upcoming: null,
      card: null,
    }
  }

  const here = compiled.rows[done]!
  const run = runOf[done]!
  const span = runs[run]!
  const s = timeline.sections[here.section]!
  const rowInSection = done - span.start + 1
  const chartHeight = s.kind === 'motif' ? s.chart.length : null

  // The first change after the current row (binary search: changes are ascending).
  let lo = 0, hi = compiled.changes.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (compiled.changes[mid]! <= done) lo = mid + 1
    else hi = mid
  }
  const change = compiled.changes[lo]
  const changeNow = lo > 0 && compiled.changes[lo - 1] === done
  const nextRun = runs[run + 1]
  const sectionEnd = span.start + span.rows // 0-based index of the first row after this section
  const nextLock = nextRun ? cardRowAt(timeline, compiled, sectionEnd)?.lockRow : null
  const upcoming
    = nextRun
      ? {
          row: sectionEnd + 1,
          rowsAway: sectionEnd - done,
          kind: 'section' as const,
          text: describeSection(timeline.sections[nextRun.section]!, nextRun.rows, yarnBySlot),
          ...(nextLock ? { cardLock: nextLock } : {}),
        }
      : { row: totalRows, rowsAway: totalRows - done, kind: 'end' as const, text: 'End of the piece: cast off as the plan says' }

  return {
    ...base,
    finished: false,
    row: done + 1,
    stepRows: [done + 1, stepEnd(timeline, done, step, totalRows)],
    pair: Math.floor(done / 2) + 1,
    section: {
      index: here.section,
      count: timeline.sections.length,
      label: s.label,
      kind: s.kind,
      row: rowInSection,
      rows: span.rows,
      pair: Math.floor((rowInSection - 1) / 2) + 1,
      pairs: Math.ceil(span.rows / 2),
      chartRow: here.chartRow === null ? null : here.chartRow + 1,
      chartHeight,
    },
    yarns: pick(here.yarns),
    changeNow,
    rowsToChange: change === undefined ? null : change - done,
    changeRow: change === undefined ? null : change + 1,
    nextYarns: change === undefined ? [] : pick(compiled.rows[change]!.yarns),
    upcoming,
    card: cardRowAt(timeline, compiled, done),
  }
}

/**
 * Whether the step from `before` to `after` completed rows passes the point where the
 * knitter should be warned: `ahead` rows before a colour change or a section start, the step
 * that ends within two rows of a shaped piece's shaping (a cast-off, a decrease or increase, needles to or from
 * holding position, the other side of the neck) and the end of the piece. Returns what to
 * announce, most important first.
 */
export function cuesForStep(
  compiled: CompiledPlan, timeline: PieceTimeline, before: number, after: number, ahead: number,
): ('change' | 'section' | 'shaping' | 'end')[] {
  if (after <= before) return []
  const cues: ('change' | 'section' | 'shaping' | 'end')[] = []
  const total = compiled.rows.length
  if (after >= total) return ['end']
  // A change at row index c is announced once the knitter has completed c − ahead rows.
  if (compiled.changes.some(c => c - ahead > before && c - ahead <= after)) cues.push('change')
  if (sectionRuns(compiled).runs.slice(1).some(sp => sp.start > before && sp.start <= after)) cues.push('section')
  // Shaping on either of the next two rows (index `after` is the next to knit) is announced now.
  const rows = timeline.shape?.rows
  if (rows) {
    for (let r = after; r <= after + 1 && r < rows.length; r++) {
      if (shapingRow(rows, r)) {
        cues.push('shaping')
        break
      }
    }
  }
  return cues
}

/** Whether machine row `r` of a shape asks for more than knitting on (see cuesForStep). */
export function shapingRow(rows: NonNullable<PieceTimeline['shape']>['rows'], r: number): boolean {
  const row = rows[r]!
  const before = rows[r - 1]
  const e = row.castOff.left + row.castOff.right + row.castOff.centre + row.decrease.left + row.decrease.right + row.increase.left + row.increase.right
  return e > 0 || (!!before && (before.part !== row.part || before.heldInPart !== row.heldInPart))
}
