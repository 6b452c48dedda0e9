// Where a shaped piece sits on the needle bed, row by row: the needles of the part being knitted
// and the ones among them that knit (its own held needles left out).
//
// Declared model (follows shapePiece's):
// - Positions count from the cast-on: needle 0 is its leftmost needle, castOn − 1 its rightmost.
//   Increases reach below 0 and past castOn − 1. A motif stays fixed to these positions (needle n
//   knits chart column (offset + n) mod width), so it does not move when an edge does.
// - Shaping at an edge moves that edge: a cast-off or a decrease of k moves it in by k, an increase
//   out by k. On a whole row a centre cast-off only comes with the last cast-off (a back's neck),
//   which leaves no needle in work.
// - The neck splits the bed where the centre cast-off sits: on the right part's first row its
//   needles are the right half of the row before plus nothing of the centre (cast off); the left
//   part starts from the left half.
// - A part's own held needles sit at its outer edges (heldAt); they stay on the bed and do not knit.

import { KnittingInputError } from './errors'
import type { ShapedPiece } from './shapePiece'

export interface RowNeedles {
  /** The part's needles on the bed after the row's shaping: positions from … to − 1 (from = to when none are left). */
  from: number
  to: number
  /** The needles that knit the row: the part's needles less its own held ones. */
  knitFrom: number
  knitTo: number
}

/** One entry per row of the piece, in its knitting order. */
export function shapedNeedles(piece: Pick<ShapedPiece, 'castOn' | 'rows'>): RowNeedles[] {
  let from = 0
  let to = piece.castOn
  let leftHalf: [number, number] | null = null
  let part: ShapedPiece['rows'][number]['part'] = 'whole'
  return piece.rows.map((r, i) => {
    if (r.part !== part) {
      if (r.part === 'right' && part === 'whole') {
        const half = (to - from - r.castOff.centre) / 2
        leftHalf = [from, from + half]
        from += half + r.castOff.centre
      }
      else if (r.part === 'left' && leftHalf) [from, to] = leftHalf
      else throw new KnittingInputError(`rows[${i}].part: ${part} rows cannot be followed by ${r.part} rows`, { field: `rows[${i}].part` })
      part = r.part
    }
    else if (r.castOff.centre > 0) {
      from = to // the last row's cast-off takes what is left between the edges
    }
    from += r.castOff.left + r.decrease.left - r.increase.left
    to -= r.castOff.right + r.decrease.right - r.increase.right
    if (to < from) to = from
    if (to - from !== r.stitches) {
      throw new KnittingInputError(`rows[${i}]: ${to - from} needles between the edges, the row counts ${r.stitches}`, { field: `rows[${i}].stitches` })
    }
    return { from, to, knitFrom: from + r.heldAt.left, knitTo: Math.max(from + r.heldAt.left, to - r.heldAt.right) }
  })
}
