// Catch-needle choice: the fewest needles which, knitting every row, leave no
// float longer than the limit.
//
// A caught stitch splits a float; the stitches on either side count separately
// and the caught stitch belongs to neither. So a float run is short enough
// exactly when every window of limit + 1 consecutive stitches inside it holds
// a caught needle. Every such window has the same length, so the whole problem
// is stabbing a set of equal-length intervals on the needle line: taking the
// right end of each window not yet stabbed, from left to right, is optimal
// (the classic greedy on right ends).
//
// Only rows where a yarn knits at least one stitch constrain that yarn: a yarn
// unused in a row is cut or carried by other means, not caught (see floats.ts).

import { assertChart } from './chart'
import { checkPlacement, needleColumns } from './placement'
import type { Chart, Placement } from './types'
import { requireInteger } from './validate'

/**
 * The fewest needles (0-based from the leftmost needle in work, ascending)
 * that, knitting every row, leave no float longer than `limit` stitches in any
 * row where that yarn is used. O(needles × chart height).
 */
export function chooseCatchNeedles(chart: Chart, placement: Placement, limit: number): number[] {
  assertChart(chart)
  const { needles, offset } = checkPlacement(placement)
  requireInteger(limit, 'limit', 1)
  if (limit >= needles) return []

  const { width, height, cells } = chart
  const cols = needleColumns(width, needles, offset)
  // needWindow[p] = 1 when the window p … p + limit must hold a caught needle.
  const windows = needles - limit
  const needWindow = new Uint8Array(windows)
  const row = new Uint8Array(needles)

  for (let r = 0; r < height; r++) {
    const base = r * width
    let ones = 0
    for (let i = 0; i < needles; i++) {
      const c = cells[base + cols[i]!]!
      row[i] = c
      ones += c
    }
    // A one-colour row leaves the other yarn unused: no constraint.
    if (ones === 0 || ones === needles) continue
    let start = 0
    for (let i = 1; i <= needles; i++) {
      if (i === needles || row[i] !== row[start]) {
        // Run start … i − 1; windows p … p + limit inside it.
        const lastWindow = i - 1 - limit
        for (let p = start; p <= lastWindow; p++) needWindow[p] = 1
        start = i
      }
    }
  }

  const caught: number[] = []
  let lastCaught = -1
  for (let p = 0; p < windows; p++) {
    if (needWindow[p] && lastCaught < p) {
      lastCaught = p + limit
      caught.push(lastCaught)
    }
  }
  return caught
}
