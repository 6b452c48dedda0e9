// Two people changed the same chart from one copy: what each changed, and both together.

export interface CombinedChart {
  /** Every stitch I changed as I left it, every other stitch as they left it. */
  rows: string[]
  /** Stitches I changed, and stitches they changed, from the copy both started from. */
  mine: number
  theirs: number
}

/**
 * Combines two edits of the chart `base`, all three as chartToRows rows ('.' main colour, 'x'
 * contrast colour, rows[0] first knitted): each stitch I changed keeps mine, every other stitch
 * takes theirs. A stitch has two colours, so a stitch both of us changed was changed the same
 * way and no change of either is lost. Null when the three are not the same size: a resize
 * moves every stitch, and there is no stitch-by-stitch answer to give.
 */
export function combineChartRows(base: string[], mine: string[], theirs: string[]): CombinedChart | null {
  const width = base[0]?.length ?? 0
  const sameSize = (rows: string[]) => rows.length === base.length && rows.every(r => r.length === width)
  if (!width || !sameSize(base) || !sameSize(mine) || !sameSize(theirs)) return null
  let changedMine = 0, changedTheirs = 0
  const rows = base.map((was, r) => {
    const my = mine[r]!, their = theirs[r]!
    let row = ''
    for (let c = 0; c < width; c++) {
      const iChanged = my[c] !== was[c]
      if (iChanged) changedMine++
      if (their[c] !== was[c]) changedTheirs++
      row += iChanged ? my[c] : their[c]
    }
    return row
  })
  return { rows, mine: changedMine, theirs: changedTheirs }
}
