// What a shaped piece asks of the knitter on one row, in the words the knit view shows: the
// shaping before the row (and before the next), the side of the neck being knitted, the needles
// in work and in holding position, and where the carriage is. Pure, from the frozen rows.
//
// Declared model (shapePiece's, read at the machine):
// - Sides are as the knitter facing the bed sees them (atMachine: the engine's are knit-side).
// - A row's shaping is made before it is knitted, in this order: the other side of the neck
//   back into work (the left part's first row), the centre cast off and the other side pushed
//   to holding position (the right part's first row), cast-offs at the carriage side, decreases,
//   increases, needles pushed to holding position for short rows.
// - A cast-off that leaves nothing on the needles is "the last n stitches"; a straight top keeps
//   its stitches after the last row (cast off or taken onto waste yarn as the plan says).

import { atMachine, type RowNeedles, type ShapedRow, type Side } from '#shared/engine'
import type { TimelineShape } from '#shared/piece/types'

export type ShapeInstructionKind = 'return' | 'join' | 'centre' | 'hold-side' | 'cast-off' | 'decrease' | 'increase' | 'hold' | 'top'

export interface ShapeInstruction {
  kind: ShapeInstructionKind
  text: string
}

export interface ShapeStep {
  /** Before knitting this row. */
  now: ShapeInstruction[]
  /** Before the row after it (shown one row ahead); empty when it only knits on. */
  next: ShapeInstruction[]
  /** The side of the neck being knitted, and this row's place in it; null across the whole piece. */
  part: { side: Side; label: string; row: number; rows: number } | null
  /** Needles that knit this row, and needles in holding position across the bed meanwhile. */
  needlesInWork: number
  held: number
  /** Where the carriage starts this row, and where it stands after it. */
  carriageBefore: Side
  carriageAfter: Side
}

const stitches = (n: number) => `${n} stitch${n === 1 ? '' : 'es'}`
const needlesWord = (n: number) => `${n} needle${n === 1 ? '' : 's'}`
const partSide = (part: ShapedRow['part']): Side | null => (part === 'whole' ? null : atMachine(part))
const neckLabel = (side: Side) => `${side === 'left' ? 'Left' : 'Right'} side of the neck`

/** The shaping before machine row `i` (0-based), in knitting order. */
function rowInstructions(shape: TimelineShape, needles: RowNeedles[], i: number): ShapeInstruction[] {
  const r = shape.rows[i]
  if (!r) return []
  const p = shape.rows[i - 1]
  const out: ShapeInstruction[] = []
  const carriage = atMachine(r.carriage)
  const firstOfPart = !!p && p.part !== r.part

  if (firstOfPart && r.part === 'left') {
    // The engine's left part is the second side knitted: its needles waited in holding position.
    const shaped = r.castOff.left + r.castOff.right + r.decrease.left + r.decrease.right - r.increase.left - r.increase.right
    const waiting = needles[i]!.to - needles[i]!.from + shaped
    out.push({ kind: 'return', text: `Now the other side: bring the ${needlesWord(waiting)} held on your ${atMachine('left')} back to work` })
    out.push({ kind: 'join', text: `Join the yarn at the carriage (${carriage})` })
  }
  if (firstOfPart && r.part === 'right') {
    if (r.castOff.centre) out.push({ kind: 'centre', text: `Cast off the centre ${stitches(r.castOff.centre)}` })
    // That side waits in holding position while this one is knitted to the shoulder.
    out.push({ kind: 'hold-side', text: `Push the ${needlesWord(r.held - r.heldInPart)} on your ${atMachine('left')} to holding position` })
  }
  const total = r.castOff.left + r.castOff.right + (firstOfPart ? 0 : r.castOff.centre)
  const last = total > 0 && r.stitches === 0
  for (const side of ['left', 'right'] as const) {
    const n = r.castOff[side]
    if (!n) continue
    const seen = atMachine(side)
    const released = (p?.heldAt[side] ?? 0) > 0 && r.heldAt[side] === 0 && p?.part === r.part
    const what = last ? `the last ${stitches(total)}` : released ? `all ${stitches(n)} of the shoulder` : stitches(n)
    out.push({ kind: 'cast-off', text: `Cast off ${what} at the ${seen} (carriage side)${released ? ', the held needles with them' : ''}` })
    if (seen !== carriage) throw new Error(`row ${i}: a cast-off at the ${seen} with the carriage at the ${carriage}`)
  }
  if (!firstOfPart && r.castOff.centre && !last) out.push({ kind: 'centre', text: `Cast off the centre ${stitches(r.castOff.centre)}` })

  const edges = (counts: { left: number; right: number }, verb: 'Decrease' | 'Increase', kind: 'decrease' | 'increase') => {
    const { left, right } = counts
    if (!left && !right) return
    if (left === right) out.push({ kind, text: `${verb} ${left} each end` })
    else {
      for (const side of ['left', 'right'] as const) {
        if (!counts[side]) continue
        // On a side of the neck the inner edge is the neck's.
        const neckEdge = (r.part === 'right' && side === 'left') || (r.part === 'left' && side === 'right')
        out.push({ kind, text: `${verb} ${counts[side]} at the ${atMachine(side)}${neckEdge ? ' (neck edge)' : ''}` })
      }
    }
  }
  edges(r.decrease, 'Decrease', 'decrease')
  edges(r.increase, 'Increase', 'increase')

  if (p && p.part === r.part) {
    for (const side of ['left', 'right'] as const) {
      const more = r.heldAt[side] - p.heldAt[side]
      if (more > 0) out.push({ kind: 'hold', text: `Push ${needlesWord(more)} at the ${atMachine(side)} to holding position (the carriage knits towards them)` })
    }
  }
  if (i === shape.rows.length - 1 && shape.leftOnNeedles > 0) {
    out.push({ kind: 'top', text: `After this row ${stitches(shape.leftOnNeedles)} stay on the needles: cast off or take them onto waste yarn as the plan says` })
  }
  return out
}

/** Rows of each part: [first, last] machine rows (0-based) of the whole piece and each side of the neck. */
export function partSummary(shape: TimelineShape): { part: ShapedRow['part']; side: Side | null; label: string; first: number; last: number }[] {
  const out: { part: ShapedRow['part']; side: Side | null; label: string; first: number; last: number }[] = []
  shape.rows.forEach((r, i) => {
    const at = out[out.length - 1]
    if (at && at.part === r.part) at.last = i
    else {
      const side = partSide(r.part)
      out.push({ part: r.part, side, label: side ? neckLabel(side) : 'Whole width', first: i, last: i })
    }
  })
  return out
}

/** Everything the knit view shows about the shaping of machine row `i` (0-based, the row about to be knitted). */
export function shapeStep(shape: TimelineShape, needles: RowNeedles[], i: number): ShapeStep {
  const r = shape.rows[i]
  if (!r) throw new RangeError(`row ${i}: the piece has ${shape.rows.length} rows`)
  const side = partSide(r.part)
  let part: ShapeStep['part'] = null
  if (side) {
    const span = partSummary(shape).find(s => s.first <= i && i <= s.last)!
    part = { side, label: neckLabel(side), row: i - span.first + 1, rows: span.last - span.first + 1 }
  }
  const n = needles[i]!
  const before = atMachine(r.carriage)
  return {
    now: rowInstructions(shape, needles, i),
    next: rowInstructions(shape, needles, i + 1),
    part,
    needlesInWork: n.knitTo - n.knitFrom,
    held: r.held,
    carriageBefore: before,
    carriageAfter: before === 'left' ? 'right' : 'left',
  }
}
