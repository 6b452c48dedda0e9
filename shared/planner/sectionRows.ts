// A compiled piece read section by section: the machine rows each section takes, the yarns it
// uses and the colour changes inside it — the planner's preview table and strip. In a shaped
// piece a section the neck splits is knitted twice (right side, then left): one entry each.

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
  /** Shaped pieces: the side of the neck these rows knit (absent for rows across the whole piece). */
  part?: 'left' | 'right'
}

export function sectionRows(timeline: PieceTimeline, compiled: CompiledPlan): SectionRows[] {
  const out: SectionRows[] = []
  const changes = new Set(compiled.changes)
  compiled.rows.forEach((row, r) => {
    const part = timeline.shape?.rows[r]?.part
    let s = out[out.length - 1]
    // A new entry where the section changes or starts its rows again (the other side of the neck).
    if (!s || s.section !== row.section || row.rowInSection === 0) {
      const section = timeline.sections[row.section]!
      s = { section: row.section, label: section.label, note: section.note ?? '', from: r + 1, to: r + 1, yarns: [], changes: 0 }
      if (part && part !== 'whole') s.part = part
      out.push(s)
    }
    s.to = r + 1
    for (const y of row.yarns) if (!s.yarns.includes(y)) s.yarns.push(y)
    if (changes.has(r)) s.changes++
  })
  return out
}
