import { NAME_MAX } from '#shared/text/nameWithSuffix'

// A plan piece knitted more than once becomes one project piece per copy: "Sleeve 1 of 2".

/** What copy `k` (from 1) of `copies` adds to the piece's name; nothing for a single copy. */
export function copySuffix(k: number, copies: number): string {
  return copies > 1 ? ` ${k} of ${copies}` : ''
}

/** The longest piece name whose every copy's name still fits a name column. */
export function longestPieceName(copies: number): number {
  return NAME_MAX - copySuffix(copies, copies).length // the last copy has the most digits
}
