// A compiled piece read section by section: the machine rows each section takes, the yarns it
// uses and the colour changes inside it — the planner's preview table and strip.

import type { CompiledPlan } from '#shared/engine'
import type { PieceTimeline } from '#shared/piece/types'

export interface SectionRows {
  section: number
  label: string
  note: string
  /** Machine rows, 1-based and inclusive, counted through the piece like the knit view. */
  from: number
  to: number
  /** Slot letters used in the section, in the order they first appear. */
  yarns: string[]
  /** Colour changes whose first row is in this section (one at its start counts here). */
  changes: number
}

export function sectionRows(timeline: PieceTimeline, compiled: CompiledPlan): SectionRows[] {
  const out: SectionRows[] = timeline.sections.map((s, i) => ({ section: i, label: s.label, note: s.note ?? '', from: 0, to: 0, yarns: [], changes: 0 }))
  compiled.rows.forEach((row, r) => {
    const s = out[row.section]!
    if (!s.from) s.from = r + 1
    s.to = r + 1
    for (const y of row.yarns) if (!s.yarns.includes(y)) s.yarns.push(y)
  })
  for (const c of compiled.changes) out[compiled.rows[c]!.section]!.changes++
  return out.filter(s => s.from > 0)
}
