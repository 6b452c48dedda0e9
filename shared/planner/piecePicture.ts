// The whole piece in its colours: one cell per stitch, one line per fabric row, line 0 the
// first row knitted (drawn at the bottom). Pure, so the planner draws it without the server.
//
// Declared model (the same as workPlanPiece's):
// - A plain section knits `rows` fabric rows in its yarn; a motif knits one fabric row per
//   chart row whatever the technique (colour-by-colour passes make one row of fabric).
// - Needle j of the cast-on knits chart column (offset + j) mod width; stitches added by
//   increases carry the repeat on outwards, as the patterning would.
// - Shaping changes one stitch each side on the last row of each step (every 7th row ×4: rows
//   7, 14, 21, 28 of the section); the width holds from there on.
// - A shaped piece (timeline.shape) draws each fabric row on the needles its part holds after
//   that row's shaping (shapedNeedles; both sides of the neck at their height), the motif fixed
//   to the bed: needle n knits column (offset + n) mod width, the cast-on's leftmost being 0.

import { compilePlan, shapedNeedles } from '#shared/engine'
import type { SectionShaping } from '#shared/engine'
import { pieceTimelinePlan } from '#shared/piece/timeline'
import type { PieceTimeline } from '#shared/piece/types'

export interface PiecePicture {
  /** Stitches across at the widest row. */
  width: number
  /** Fabric rows. */
  height: number
  /** Slot letters; a cell holds 0 (no stitch) or 1 + the index of its slot here. */
  slots: string[]
  /** Row-major, row 0 first: cells[row * width + stitch]. */
  cells: Uint8Array
}

/** Stitches across on each fabric row. */
export function rowWidths(timeline: PieceTimeline, shaping: (SectionShaping | null)[]): number[] {
  const widths: number[] = []
  let stitches = timeline.needles
  timeline.sections.forEach((s, k) => {
    const rows = s.kind === 'plain' ? s.rows : s.chartRows
    const changeAt = new Set<number>()
    let at = 0
    for (const step of shaping[k]?.steps ?? []) {
      for (let t = 0; t < step.times; t++) { at += step.every; changeAt.add(at) }
    }
    const by = shaping[k]?.change === 'increase' ? 2 : -2
    for (let r = 1; r <= rows; r++) {
      if (changeAt.has(r)) stitches = Math.max(0, stitches + by)
      widths.push(stitches)
    }
  })
  return widths
}

export function piecePicture(timeline: PieceTimeline, offsets: number[], shaping: (SectionShaping | null)[]): PiecePicture {
  if (timeline.shape) return shapedPicture(timeline, offsets)
  const widths = rowWidths(timeline, shaping)
  const width = Math.max(timeline.needles, ...widths)
  const height = widths.length
  const slots = timeline.yarns.map(y => y.slot)
  const colour = new Map(slots.map((s, i) => [s, i + 1]))
  const cells = new Uint8Array(width * height)
  const castOnLeft = (width - timeline.needles) / 2
  let row = 0
  timeline.sections.forEach((s, k) => {
    const rows = s.kind === 'plain' ? s.rows : s.chartRows
    for (let r = 0; r < rows; r++, row++) {
      const w = widths[row]!
      const from = (width - w) / 2
      const line = row * width
      if (s.kind === 'plain') {
        cells.fill(colour.get(s.yarn) ?? 0, line + from, line + from + w)
        continue
      }
      const chartLine = s.chart[r % s.chart.length]!
      const cw = chartLine.length
      const main = colour.get(s.main) ?? 0
      const contrast = colour.get(s.contrast) ?? 0
      for (let i = from; i < from + w; i++) {
        const col = (((offsets[k] ?? 0) + i - castOnLeft) % cw + cw) % cw
        cells[line + i] = chartLine[col] === 'x' ? contrast : main
      }
    }
  })
  return { width, height, slots, cells }
}

function shapedPicture(timeline: PieceTimeline, offsets: number[]): PiecePicture {
  const shape = timeline.shape!
  const needles = shapedNeedles(shape)
  const fabric = compilePlan(pieceTimelinePlan(timeline)).rows
  const left = Math.min(0, ...needles.map(n => n.from))
  const width = Math.max(timeline.needles, ...needles.map(n => n.to)) - left
  const height = fabric.length
  const slots = timeline.yarns.map(y => y.slot)
  const colour = new Map(slots.map((s, i) => [s, i + 1]))
  const cells = new Uint8Array(width * height)
  shape.rows.forEach((r, i) => {
    const n = needles[i]!
    const f = fabric[r.row]
    if (!f) return
    const s = timeline.sections[f.section]!
    const line = r.row * width - left
    if (s.kind === 'plain' || f.chartRow === null) {
      cells.fill(colour.get(f.yarns[0]!) ?? 0, line + n.from, line + n.to)
      return
    }
    const chartLine = s.chart[f.chartRow]!
    const cw = chartLine.length
    const main = colour.get(s.main) ?? 0
    const contrast = colour.get(s.contrast) ?? 0
    for (let k = n.from; k < n.to; k++) cells[line + k] = chartLine[(((offsets[f.section] ?? 0) + k) % cw + cw) % cw] === 'x' ? contrast : main
  })
  return { width, height, slots, cells }
}
