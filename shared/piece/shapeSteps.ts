// The shaping of a piece at the machine, row by row, in the words the knit view shows: what to do
// before the row about to be knitted (cast off, decrease, push needles to holding position, bring
// them back), what comes on the row after, which part of the piece this is, how many needles knit
// and where the carriage is. Pure: a function of the frozen shape and the row index only, so a
// knitter who jumps to a row gets exactly what walking there would give.
//
// Sides at the machine. The engine names every side from the knit side, as the piece is drawn.
// At a single-bed machine the knitter stands facing the purl side, so every "left" and "right"
// this module writes or returns (the texts, `side`, `part.side`, the carriage) is the knitter's
// own left and right at the machine: the engine's names swapped, by `atMachine`
// (shared/engine/sides.ts, which the plan's carriage side also goes through) and nowhere else.
// The carriage and the edge it casts off at swap together, so a cast-off is still at the
// carriage side. `part.kind` alone keeps the engine's name: it is the key of the rows' part.

import { atMachine } from '#shared/engine'
import type { RowNeedles, ShapedRow, Side } from '#shared/engine'
import type { TimelineShape } from '#shared/piece/types'

/** The knitter's side at the machine for a side the engine names from the knit side (shared/engine/sides.ts). */
export const machineSide: (engineSide: Side) => Side = atMachine

export type ShapeInstructionKind
  = | 'cast-off' // at an edge, a part of the stitches
    | 'cast-off-centre' // the neck's centre, by hand
    | 'cast-off-all' // the stitches left on the part (the end of a shaped top)
    | 'decrease'
    | 'increase'
    | 'hold' // needles pushed to holding position
    | 'return' // held needles brought back to work
    | 'join' // the yarn joined again for the second part
    | 'take-off' // after the last row of a straight top

export interface ShapeInstruction {
  kind: ShapeInstructionKind
  text: string
  /** At the machine; 'both' for a pair at each end. Absent when no side applies. */
  side?: Side | 'both' | 'centre'
  /** Stitches or needles the instruction is about (each end for a pair). */
  count: number
  /** A setting that goes with it, shown smaller under the text. */
  note?: string
}

export interface ShapePart {
  /** The part as the rows name it (the engine's, seen from the knit side). */
  kind: 'left' | 'right'
  /** The part's side at the machine. */
  side: Side
  label: string
  /** 1-based row within the part, and the part's rows. */
  row: number
  rows: number
}

export interface ShapeStep {
  /** Before knitting this row. */
  now: ShapeInstruction[]
  /** Before knitting the row after (shown one row ahead); after the last row, what to do then. */
  next: ShapeInstruction[]
  /** Null on rows across the whole piece. */
  part: ShapePart | null
  /** Needles knitting this row (the part's own held ones left out). */
  needlesInWork: number
  /** Needles in holding position across the bed during this row. */
  held: number
  /** Where the carriage starts this row and where it stands after it, at the machine. */
  carriageBefore: Side
  carriageAfter: Side
  /** This is the piece's last row (`next` is then what to do after it, not a row). */
  last: boolean
  /** The index is past the last row: the piece is knitted. */
  finished: boolean
}

export interface PartSpan {
  kind: ShapedRow['part']
  /** At the machine; null for the whole piece. */
  side: Side | null
  label: string
  /** Machine rows (0-based indexes into the shape's rows), first and last inclusive. */
  firstRow: number
  lastRow: number
  rows: number
  /** Fabric rows from the cast-on (0-based) the part knits; the second part repeats the first's. */
  fabricFrom: number
  fabricTo: number
}

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`

/** A part's name at the machine: "Left side of neck" (the knitter's left), "Below the neck", "Whole piece". */
export function partLabel(kind: ShapedRow['part'], hasParts: boolean): string {
  if (kind === 'whole') return hasParts ? 'Below the neck' : 'Whole piece'
  return `${cap(machineSide(kind))} side of neck`
}

/** The parts of a shape in knitting order, with their machine rows (for finding which part a row is in). */
export function partSummary(shape: TimelineShape): PartSpan[] {
  const spans: PartSpan[] = []
  const hasParts = shape.rows.some(r => r.part !== 'whole')
  shape.rows.forEach((r, i) => {
    const last = spans.at(-1)
    if (last && last.kind === r.part) {
      last.lastRow = i
      last.rows++
      last.fabricTo = r.row
      return
    }
    spans.push({
      kind: r.part,
      side: r.part === 'whole' ? null : machineSide(r.part),
      label: partLabel(r.part, hasParts),
      firstRow: i,
      lastRow: i,
      rows: 1,
      fabricFrom: r.row,
      fabricTo: r.row,
    })
  })
  return spans
}

/** The span a machine row (0-based) is in, or null past the end. */
export function partOfRow(spans: PartSpan[], rowIndex: number): PartSpan | null {
  return spans.find(s => rowIndex >= s.firstRow && rowIndex <= s.lastRow) ?? null
}

const sides = ['left', 'right'] as const
const noHeld = { left: 0, right: 0 }

/** An edge change (decrease, increase) in words: "each end", or per side with the neck edge named. */
function edgeChanges(kind: 'decrease' | 'increase', counts: { left: number; right: number }, part: ShapedRow['part']): ShapeInstruction[] {
  const verb = kind === 'decrease' ? 'Decrease' : 'Increase'
  if (counts.left > 0 && counts.left === counts.right) return [{ kind, side: 'both', count: counts.left, text: `${verb} ${counts.left} each end` }]
  const neckEdge: Side | null = part === 'whole' ? null : part === 'right' ? 'left' : 'right'
  return sides.filter(s => counts[s] > 0).map(s => ({
    kind,
    side: machineSide(s),
    count: counts[s],
    text: `${verb} ${counts[s]} at the ${machineSide(s)}${s === neckEdge ? ' (neck edge)' : ''}`,
  }))
}

/** What to do at the start of rows[i], before knitting it. */
function instructionsBefore(shape: TimelineShape, i: number): ShapeInstruction[] {
  const rows = shape.rows
  const r = rows[i]!
  const prev = i > 0 ? rows[i - 1]! : null
  const out: ShapeInstruction[] = []
  const startsPart = !prev || prev.part !== r.part
  const heldBefore = startsPart ? noHeld : prev!.heldAt
  const carriage = machineSide(r.carriage)

  // The second part: the needles that waited come back, the yarn is joined where the carriage is.
  if (startsPart && prev && r.part !== 'whole' && prev.part !== 'whole') {
    const waiting = prev.held - prev.heldInPart
    out.push({
      kind: 'return',
      side: machineSide(r.part),
      count: waiting,
      text: `Now the ${machineSide(r.part)} side: bring the ${plural(waiting, 'held needle', 'held needles')} back to work`,
    })
    out.push({ kind: 'join', side: carriage, count: 0, text: `Join the yarn at the ${carriage} edge, where the carriage is` })
  }

  // Cast-offs. A row that leaves the part without stitches ends it: one instruction for all.
  const edgeCastOff = r.castOff.left + r.castOff.right
  const released = { left: Math.max(0, heldBefore.left - r.heldAt.left), right: Math.max(0, heldBefore.right - r.heldAt.right) }
  const heldNote = (n: number) => (n > 0 ? `, the ${n} held ones included` : '')
  const sideNote = (s: Side) => (s === carriage ? ' (carriage side)' : '')
  if (r.stitches === 0 && edgeCastOff + r.castOff.centre > 0) {
    const total = edgeCastOff + r.castOff.centre
    const engineSide = r.castOff.left > 0 ? 'left' : r.castOff.right > 0 ? 'right' : null
    let earlier = false
    for (let j = i - 1; j >= 0 && rows[j]!.part === r.part; j--) {
      if (rows[j]!.castOff.left + rows[j]!.castOff.right > 0) { earlier = true; break }
    }
    const what = `${earlier ? 'the last' : 'all'} ${plural(total, 'stitch', 'stitches')}${r.part === 'whole' ? '' : ' of the shoulder'}`
    const where = engineSide ? ` at the ${machineSide(engineSide)}${sideNote(machineSide(engineSide))}` : ''
    const neck = engineSide && r.castOff.centre > 0 && shape.kind === 'body' ? ', the back neck included' : ''
    out.push({
      kind: 'cast-off-all',
      side: engineSide ? machineSide(engineSide) : 'centre',
      count: total,
      text: `Cast off ${what}${where}${neck}${heldNote(released.left + released.right)}`,
    })
  }
  else {
    if (r.castOff.centre > 0) {
      out.push({ kind: 'cast-off-centre', side: 'centre', count: r.castOff.centre, text: `Cast off the centre ${plural(r.castOff.centre, 'stitch', 'stitches')}` })
    }
    for (const s of sides) {
      if (r.castOff[s] === 0) continue
      const m = machineSide(s)
      out.push({ kind: 'cast-off', side: m, count: r.castOff[s], text: `Cast off ${r.castOff[s]} at the ${m}${sideNote(m)}${heldNote(released[s])}` })
    }
  }

  // The split: the other side's needles wait in holding position while this part is knitted.
  // The first needles held since none were: the carriage must be set to leave them unknitted.
  const carriageNote = (prev?.held ?? 0) === 0 ? { note: 'Set the carriage to pass over needles in holding position.' } : {}
  if (startsPart && r.part !== 'whole' && (!prev || prev.part === 'whole')) {
    const waiting = r.held - r.heldInPart
    if (waiting > 0) {
      out.push({
        kind: 'hold',
        side: machineSide(r.part === 'right' ? 'left' : 'right'),
        count: waiting,
        text: `Push the ${machineSide(r.part === 'right' ? 'left' : 'right')} ${plural(waiting, 'needle', 'needles')} to holding position`,
        ...carriageNote,
      })
    }
  }

  out.push(...edgeChanges('decrease', r.decrease, r.part), ...edgeChanges('increase', r.increase, r.part))

  // Short rows: needles going to holding position at an edge of the part; held ones coming back
  // without a cast-off (not made by the engine today, said if a shape ever has it).
  const shortRowNote = out.some(o => o.kind === 'hold') ? {} : carriageNote
  for (const s of sides) {
    const m = machineSide(s)
    const added = r.heldAt[s] - heldBefore[s]
    if (added > 0) {
      out.push({ kind: 'hold', side: m, count: added, text: `Push ${plural(added, 'needle', 'needles')} at the ${m} to holding position`, ...shortRowNote })
    }
    else if (added < 0 && r.castOff[s] === 0) {
      out.push({ kind: 'return', side: m, count: -added, text: `Bring the ${plural(-added, 'held needle', 'held needles')} at the ${m} back to work` })
    }
  }
  return out
}

/** What to do after the last row: a straight top keeps its stitches on the needles. */
function instructionsAfterLast(shape: TimelineShape): ShapeInstruction[] {
  const n = shape.leftOnNeedles
  if (n <= 0) return []
  return [{ kind: 'take-off', count: n, text: `Take the ${plural(n, 'stitch', 'stitches')} off on waste yarn, or cast them off` }]
}

/**
 * The shaping at machine row `rowIndex` (0-based, the row about to be knitted); `rowIndex` equal
 * to the number of rows is the piece knitted (`now` is then what to do with the stitches left).
 * `needles` is shapedNeedles of the same rows.
 */
export function shapeStep(shape: TimelineShape, needles: RowNeedles[], rowIndex: number): ShapeStep {
  const rows = shape.rows
  if (needles.length !== rows.length) throw new RangeError(`needles: ${needles.length} entries for ${rows.length} rows`)
  if (!Number.isInteger(rowIndex) || rowIndex < 0 || rowIndex > rows.length) {
    throw new RangeError(`rowIndex: ${rowIndex} is not a row of this piece (0 to ${rows.length})`)
  }
  if (rows.length === 0) throw new RangeError('rows: a shape has at least one row')
  if (rowIndex === rows.length) {
    const lastRow = rows.at(-1)!
    const after = machineSide(lastRow.carriage === 'left' ? 'right' : 'left')
    const now = instructionsAfterLast(shape)
    return { now, next: [], part: null, needlesInWork: shape.leftOnNeedles, held: 0, carriageBefore: after, carriageAfter: after, last: false, finished: true }
  }
  const r = rows[rowIndex]!
  const n = needles[rowIndex]!
  let part: ShapePart | null = null
  if (r.part !== 'whole') {
    const span = partOfRow(partSummary(shape), rowIndex)!
    part = { kind: r.part, side: machineSide(r.part), label: span.label, row: rowIndex - span.firstRow + 1, rows: span.rows }
  }
  const last = rowIndex === rows.length - 1
  const before = machineSide(r.carriage)
  return {
    now: instructionsBefore(shape, rowIndex),
    next: last ? instructionsAfterLast(shape) : instructionsBefore(shape, rowIndex + 1),
    part,
    needlesInWork: n.knitTo - n.knitFrom,
    held: r.held,
    carriageBefore: before,
    carriageAfter: before === 'left' ? 'right' : 'left',
    last,
    finished: false,
  }
}
