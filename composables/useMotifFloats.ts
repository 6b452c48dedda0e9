import type { FloatVerdict } from '#shared/engine'

// Words and small pure helpers for the float check beside the motif grid.

/** The verdict in a knitter's words (≤ 3 tidy, 4–5 moderate, 6 or more long: DESIGN §2). */
export const verdictWords: Record<FloatVerdict, string> = {
  tidy: 'Tidy inside',
  moderate: 'Moderate floats',
  long: 'Long floats: line or hide the inside',
}

/** A longer note for the editor: what the verdict means for the piece. */
export const verdictNotes: Record<FloatVerdict, string> = {
  tidy: 'Floats of 3 stitches or fewer: the inside may be seen (a jumper, a scarf).',
  moderate: 'Floats of 4 or 5 stitches: fine for most garments; fingers and buttons may catch them.',
  long: 'Floats of 6 stitches or more snag: knit it where the inside is lined or hidden (a cushion, a lined jacket), or catch the floats.',
}

/** Classes for a verdict badge, from the theme's colour roles. */
export const verdictTone: Record<FloatVerdict, string> = {
  tidy: 'bg-ok/10 text-ok',
  moderate: 'bg-warn/10 text-warn',
  long: 'bg-danger/10 text-danger',
}

/** Chart rows (0-based) as a knitter reads them: 1-based, runs joined, "1–4, 9". */
export function rowRanges(rows: number[]): string {
  const parts: string[] = []
  for (let i = 0; i < rows.length; i++) {
    let j = i
    while (j + 1 < rows.length && rows[j + 1] === rows[j]! + 1) j++
    parts.push(j === i ? String(rows[i]! + 1) : `${rows[i]! + 1}–${rows[j]! + 1}`)
    i = j
  }
  return parts.join(', ')
}

/** "row 3" or "rows 1–4, 9". */
export function rowsPhrase(rows: number[]): string {
  return `${rows.length === 1 ? 'row' : 'rows'} ${rowRanges(rows)}`
}

/** Needle pitches by machine gauge (DESIGN §2, common practice). */
export const needlePitches = [
  { mm: 4.5, label: 'Standard, 4.5 mm' },
  { mm: 6.5, label: 'Mid, 6.5 mm' },
  { mm: 9, label: 'Bulky, 9 mm' },
] as const
