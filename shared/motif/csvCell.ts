// One CSV cell that a spreadsheet shows as text. A cell starting with = + - @ tab or CR is run
// as a formula by spreadsheet programs, so it gets a leading ' (OWASP, "CSV Injection").
// A value that itself starts with ' gets one too, so a reader can always tell our prefix
// from the value's own apostrophe and take off exactly the one we added.

const needsGuard = /^[=+\-@\t\r']/
const guarded = /^'[=+\-@\t\r']/

export function guardCsvCell(value: string): string {
  return needsGuard.test(value) ? `'${value}` : value
}

export function unguardCsvCell(cell: string): string {
  return guarded.test(cell) ? cell.slice(1) : cell
}

/** Always quoted (RFC 4180: '"' doubled), so commas and line breaks stay inside the one cell. */
export function quotedCsvCell(value: string): string {
  return `"${guardCsvCell(value).replaceAll('"', '""')}"`
}

/**
 * The quoted cell opening at `text[start]` (a '"'): its value with '""' read as '"' and our
 * prefix taken off, and the index just after the closing quote; null when it is never closed.
 */
export function readQuotedCsvCell(text: string, start: number): { value: string; end: number } | null {
  let value = ''
  let i = start + 1
  while (i < text.length) {
    const quote = text.indexOf('"', i)
    if (quote < 0) break
    value += text.slice(i, quote)
    if (text[quote + 1] !== '"') return { value: unguardCsvCell(value), end: quote + 1 }
    value += '"'
    i = quote + 2
  }
  return null
}
