// The float check drawn on the chart: which cells lie in a float that is too long.

import { needleColumns } from './placement'
import type { Chart, Placement } from './types'

/**
 * Which chart cells belong to a float longer than `limit` stitches, over the needles in
 * work (runs continue across repeat boundaries, as the engine counts them). A run of one
 * colour is a float of the other yarn; a row where one yarn knits nothing is not marked
 * (that is a full-width float, cut and woven in, reported on its own). A cell is marked when
 * any needle knitting it sits in such a run. O(needles × rows).
 */
export function longFloatCells(chart: Chart, placement: Placement, limit: number): Uint8Array {
  const { width, height, cells } = chart
  const needles = placement.needles
  const cols = needleColumns(width, needles, placement.offset ?? 0)
  const marks = new Uint8Array(width * height)
  for (let r = 0; r < height; r++) {
    const base = r * width
    let start = 0
    const first = cells[base + cols[0]!]
    let oneColour = true
    for (let i = 1; i < needles && oneColour; i++) if (cells[base + cols[i]!] !== first) oneColour = false
    if (oneColour) continue
    for (let i = 1; i <= needles; i++) {
      if (i === needles || cells[base + cols[i]!] !== cells[base + cols[start]!]) {
        if (i - start > limit) for (let k = start; k < i; k++) marks[base + cols[k]!] = 1
        start = i
      }
    }
  }
  return marks
}
