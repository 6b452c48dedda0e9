// Names live in VARCHAR(120) columns (people, studios, plans, pieces, projects). A name the
// server builds from another name ("<name>’s studio", "<piece> 1 of 2") must fit the same column.

export const NAME_MAX = 120

const graphemes = new Intl.Segmenter('und', { granularity: 'grapheme' })

/**
 * `name` followed by `suffix`, with the name cut short and ending in "…" when both together
 * would pass `max` characters. The cut falls between graphemes, so no accent or emoji is split.
 * Lengths count UTF-16 units, as the name's own check does (never fewer than the column's).
 */
export function nameWithSuffix(name: string, suffix: string, max = NAME_MAX): string {
  if (name.length + suffix.length <= max) return name + suffix
  let kept = ''
  for (const { segment } of graphemes.segment(name)) {
    if (kept.length + segment.length + 1 + suffix.length > max) break
    kept += segment
  }
  return `${kept.trimEnd()}…${suffix}`
}
