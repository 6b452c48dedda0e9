// The shaping of one garment piece, row by row: a body (back or front) or a sleeve, from its
// measurements and the swatch gauge to one entry per machine row (carriage pass).
//
// Declared model (every rule common practice unless it says otherwise; the spreading of a
// slope is the handbooks' "magic formula", spreadShaping — published):
// - Sides. Every "left" and "right" (the carriage, the edges, the parts) is seen from the knit
//   side, as the piece is drawn. At a single-bed machine the knitter faces the purl side, so a
//   screen at the machine swaps the names; the piece is symmetric, so nothing else changes.
// - Counts. Widths become stitches with stitchesForWidth, lengths rows with rowsForLength (both
//   half up). castOn = stitchesForWidth(hemWidth). Rows are machine rows; row 0 starts from
//   carriageStart (default 'right') and the carriage alternates side every row. Shaping is
//   made at the start of a row, before it is knitted: cast-offs, then edge decreases and
//   increases (transfers, possible at both edges before the same row).
// - Cast-offs are made at the carriage side: an edge cast-off only on a row whose carriage
//   starts from that side, so a two-sided one (armhole, cap, a back's shoulders) takes two
//   consecutive rows, the carriage side first. The neck's centre is cast off by hand
//   (castOff.centre) whatever the carriage side.
// - Slopes. A slope of n changes over R rows is spreadShaping(n, R), each change on the last
//   row of its interval (every 4th row ×3 over rows 1–12 of the zone: rows 4, 8, 12), the
//   shorter intervals first. Side and sleeve shaping, armhole and cap decreases are pairs, one
//   change at each end of the same row.
// - Side shaping (body: hem → chest; sleeve: cuff → upper arm). steps = |width − hemWidth| in
//   stitches / 2, a half up; spread over the rows to the underarm (a body without an armhole:
//   up to its first top shaping row, if that comes first). width absent or equal to hemWidth:
//   no side shaping. An odd difference leaves the chest a stitch off `width` (pairs keep the
//   piece symmetric).
// - Armhole (body). On the row after rowsForLength(lengthToUnderarm) rows: castOff stitches
//   at each side (two rows), then `decrease` stitches at each side, one pair every 2nd row
//   (spreadShaping(d, 2d)). The width left is the piece across the shoulders. No armhole is a
//   drop shoulder: the piece is straight from the chest up and lengthToUnderarm is its whole
//   length.
// - Height. Total rows = rowsForLength(lengthToUnderarm + armhole.depth) (sleeve:
//   lengthToUnderarm + cap.height). With a neck the total may move by one row and the neck
//   depth by one row (parity rule below).
// - Neck (body). Its stitches at the top are what the shoulders leave across the shoulders
//   (neck.width must fit beside them). It starts rowsForLength(neck.depth) rows below the top.
//   On its first row the centre is cast off (castOff.centre); then the part right of the neck
//   is knitted to the top ('right' rows) while every needle left of the centre waits in
//   holding position (`held`); then the left part, mirrored ('left' rows, same row count and
//   shaping with left and right swapped, the carriage on the mirrored side).
//   Why the right part first: the neck starts on a row whose carriage starts from the right,
//   so the yarn from the row before ends at the right edge and the right part carries on with
//   it; after its last row the carriage stands at the left, where the yarn is joined again
//   for the left part. Parity rule: the neck's first row is a carriage-right row and each part
//   has an odd number of rows, so each part's last row starts from its outer edge, where its
//   shoulder is cast off; the total (and with it the neck depth) moves by one row to the
//   nearer count that allows it, within the ±1 row of rounding.
//   Shapes: round — about a quarter of the neck decreased at each neck edge (⌊neck / 4⌋ each
//   side), the rest cast off at the centre; v — no centre cast-off (one stitch for an odd
//   count), half the neck decreased at each neck edge; square — the whole neck cast off at the
//   centre, straight sides. Neck-edge decreases are spread over the part's rows from its
//   second row to the row before its shoulder shaping starts, so the neck is done before the
//   shoulder begins and every shoulder stitch is cast off at the outer edge. The neck must
//   start after the armhole shaping ends.
// - Shoulders (each). stitchesForWidth(shoulder.width) stitches; the drop's rows give
//   ⌊drop rows / 2⌋ + 1 steps, sizes spreadShaping(steps, stitches) (the smaller steps first).
//   'cast-off': a step cast off at the outer edge on each carriage-side row, the last step on
//   the last row. 'hold': short rows — on each row before a carriage-side row one step's
//   needles go to holding position at the outer edge (the carriage starts from the other
//   side, so it knits towards them), all but the last step; on the last row the whole
//   shoulder, held needles included, is cast off at once. Drop 0: one step, the shoulder cast
//   off straight on the last row. Without a neck (a back) the two shoulders step on pairs of
//   rows, the carriage side first, and on the last row the stitches left between them (the
//   back neck) go with castOff.centre. A body with a neck but no shoulder has straight
//   shoulders of what the neck leaves, cast off on each part's last row.
// - Sleeve cap. On the row after the underarm: castOff at each side (two rows); pairs of
//   decreases spread over the rows from there to the row before the last, leaving topWidth
//   (a stitch wider for an odd difference); the top cast off on the last row at the carriage
//   side. No cap: a straight top.
// - A shaped top (neck, shoulders, cap) ends with its cast-off on the last row: that row's
//   castOff takes every stitch left and the carriage's pass ends the part with 0 stitches.
//   A straight top (a body with neither neck nor shoulders, a sleeve without a cap) keeps its
//   stitches on the needles after the last row (`leftOnNeedles`), to be cast off or taken
//   onto waste yarn after it: a rectangle is castOn stitches on every row.
// - `stitches`: on a 'whole' row every stitch on the bed; on a part's row that part's stitches
//   (its own needles in holding position included). `held`: every needle in holding position
//   across the bed during the row (the other part's, and short-row ones); `heldInPart` the
//   part's own among them, so the needles on the bed are stitches + held − heldInPart.

import { KnittingInputError } from './errors'
import { rowsForLength, roundHalfUp, stitchesForWidth } from './gauge'
import { MAX_SHAPING_ROWS, spreadShaping } from './shaping'
import type { Gauge } from './types'
import { requireNonNegative, requireObject, requirePositive } from './validate'

export type Side = 'left' | 'right'

export interface ShapeSpec {
  kind: 'body' | 'sleeve'
  /** Side of the carriage before row 0; default 'right'. */
  carriageStart?: Side
  /** Lengths in cm, flat, ease included. */
  hemWidth: number
  /** Body: width at the chest (side shaping when it differs); sleeve: upper arm. */
  width?: number
  lengthToUnderarm: number
  /** Body: each side; depth from the underarm to the shoulder point. */
  armhole?: { castOff: number; decrease: number; depth: number }
  /** Sleeve cap. */
  cap?: { castOff: number; height: number; topWidth: number }
  /** Each shoulder; drop 0 = straight. */
  shoulder?: { width: number; drop: number; method: 'cast-off' | 'hold' }
  neck?: { width: number; depth: number; shape: 'round' | 'v' | 'square' }
}

export interface ShapedRow {
  /** Which part this row knits ('left' = left of the neck, seen from the knit side). */
  part: 'whole' | Side
  /** Side the carriage starts this row from. */
  carriage: Side
  /** Stitches on the needles of this part after this row's shaping (held ones included). */
  stitches: number
  /** Needles in holding position across the bed during this row. */
  held: number
  /** This part's own needles in holding position (short rows), counted in `held` and `stitches`. */
  heldInPart: number
  /** Where this part's own held needles are: at its outer edges (left + right = heldInPart). */
  heldAt: { left: number; right: number }
  /** Fabric row from the cast-on (0-based); the left part's rows repeat the right part's. */
  row: number
  /** At the start of the row, before knitting it. */
  castOff: { left: number; right: number; centre: number }
  /** Edge decreases before the row (transfers). */
  decrease: { left: number; right: number }
  increase: { left: number; right: number }
}

export interface ShapedPiece {
  castOn: number
  /** One per machine row (carriage pass), in knitting order. */
  rows: ShapedRow[]
  /** Stitches still on the needles after the last row (a straight top); 0 when the top is cast off in the rows. */
  leftOnNeedles: number
  /** The counts the rows were made from. */
  counts: {
    rowsToUnderarm: number
    rowsTotal: number
    /** Stitches at the chest (body) or upper arm (sleeve), after the side shaping. */
    width: number
    /** Body: stitches across the shoulders after the armhole; sleeve: at the top of the cap. */
    top: number
    /** Each shoulder, 0 without shoulders or neck. */
    shoulder: number
    /** The neck at the top, 0 without a neck. */
    neck: number
    /** Neck cast off at the centre and decreased at each neck edge. */
    neckCentre: number
    neckDecreases: number
    /** Rows of each part (the neck's depth in rows), 0 without a neck. */
    neckRows: number
  }
}

interface Events {
  castOff: { left: number; right: number; centre: number }
  decrease: { left: number; right: number }
  increase: { left: number; right: number }
  /** Needles pushed to holding position at an edge at the start of the row. */
  hold: { left: number; right: number }
  /** The side's held needles are cast off with this row's cast-off. */
  release: { left: boolean; right: boolean }
}

const blank = (): Events => ({
  castOff: { left: 0, right: 0, centre: 0 },
  decrease: { left: 0, right: 0 },
  increase: { left: 0, right: 0 },
  hold: { left: 0, right: 0 },
  release: { left: false, right: false },
})

const other = (s: Side): Side => (s === 'left' ? 'right' : 'left')

function fail(field: string, message: string): never {
  throw new KnittingInputError(`${field}: ${message}`, { field })
}

/** Rows of a zone (1-based) that carry a change: the last row of each spreadShaping interval. */
function changeRows(steps: number, rows: number): number[] {
  if (steps === 0) return []
  const out: number[] = []
  let at = 0
  for (const s of spreadShaping(steps, rows)) {
    for (let t = 0; t < s.times; t++) out.push((at += s.every))
  }
  return out
}

/** Step sizes of `total` stitches in `steps` near-equal steps, the smaller first. */
function stepSizes(steps: number, total: number): number[] {
  return spreadShaping(steps, total).flatMap(s => Array.from({ length: s.times }, () => s.every))
}

/** The whole number nearest `exact` among n − 1 and n + 1 (n + 1 on a tie), never below `min`. */
function otherParity(n: number, exact: number, min: number): number {
  return exact >= n || n - 1 < min ? n + 1 : n - 1
}

function enumField<T extends string>(value: unknown, field: string, allowed: readonly T[]): T {
  if (!allowed.includes(value as T)) {
    fail(field, `expected ${allowed.map(a => JSON.stringify(a)).join(' or ')}, got ${JSON.stringify(value) ?? 'nothing'}`)
  }
  return value as T
}

/** Shape one piece: the cast-on and every machine row with its shaping. */
export function shapePiece(spec: ShapeSpec, gauge: { stitchesPer10cm: number; rowsPer10cm: number }): ShapedPiece {
  const sp = requireObject(spec, 'spec') as unknown as ShapeSpec
  const gRaw = requireObject(gauge, 'gauge')
  const spc = requirePositive(gRaw.stitchesPer10cm, 'gauge.stitchesPer10cm')
  const rpc = requirePositive(gRaw.rowsPer10cm, 'gauge.rowsPer10cm')
  const g: Gauge = { stitchesPer10cm: spc, rowsPer10cm: rpc, stitchWidthMm: 100 / spc, rowHeightMm: 100 / rpc }
  const sts = (cm: number) => stitchesForWidth(cm, g)
  const rowsOf = (cm: number) => rowsForLength(cm, g)

  const kind = enumField(sp.kind, 'kind', ['body', 'sleeve'] as const)
  const start: Side = sp.carriageStart === undefined ? 'right' : enumField(sp.carriageStart, 'carriageStart', ['left', 'right'] as const)
  const carriageOf = (r: number): Side => (r % 2 === 0 ? start : other(start))

  const C = sts(requirePositive(sp.hemWidth, 'hemWidth'))
  if (C < 2) fail('hemWidth', `${sp.hemWidth} cm is ${C} stitches; a piece needs at least 2`)
  if (C > MAX_SHAPING_ROWS) fail('hemWidth', `${C} stitches is more than ${MAX_SHAPING_ROWS}`)
  const W0 = sp.width === undefined ? C : sts(requirePositive(sp.width, 'width'))
  const L = requirePositive(sp.lengthToUnderarm, 'lengthToUnderarm')
  const U = rowsOf(L)
  if (U < 1) fail('lengthToUnderarm', `${L} cm is less than one row`)

  for (const f of kind === 'sleeve' ? ['armhole', 'shoulder', 'neck'] as const : ['cap'] as const) {
    if (sp[f] !== undefined) fail(f, `a ${kind} has no ${f}${kind === 'sleeve' ? ' (its top is the cap)' : ' (a cap belongs to a sleeve)'}`)
  }
  const arm = sp.armhole === undefined ? null : requireObject(sp.armhole, 'armhole')
  const cap = sp.cap === undefined ? null : requireObject(sp.cap, 'cap')
  const sh = sp.shoulder === undefined ? null : requireObject(sp.shoulder, 'shoulder')
  const nk = sp.neck === undefined ? null : requireObject(sp.neck, 'neck')

  const sideSteps = roundHalfUp(Math.abs(W0 - C) / 2)
  const widen = W0 >= C ? 1 : -1
  const W = C + widen * 2 * sideSteps
  if (W < 2) fail('width', `${sp.width} cm leaves ${W} stitches; a piece needs at least 2`)

  // Heights.
  const depthCm = arm ? requirePositive(arm.depth, 'armhole.depth') : cap ? requirePositive(cap.height, 'cap.height') : 0
  const exactTotal = (L + depthCm) * rpc / 10
  let T = rowsOf(L + depthCm)
  if (T > MAX_SHAPING_ROWS) fail('lengthToUnderarm', `${T} rows is more than ${MAX_SHAPING_ROWS}`)

  // Armhole: its rows and the stitches across the shoulders.
  const aCo = arm ? sts(requireNonNegative(arm.castOff, 'armhole.castOff')) : 0
  const aDec = arm ? sts(requireNonNegative(arm.decrease, 'armhole.decrease')) : 0
  if (2 * aCo >= W) fail('armhole.castOff', `${aCo} stitches each side leave nothing of the ${W} at the chest`)
  const P = W - 2 * aCo - 2 * aDec
  if (P < 2) fail('armhole.decrease', `${aDec} stitches each side leave ${P} across the shoulders`)
  const aDecStart = U + (aCo > 0 ? 2 : 0)
  const armEnd = arm ? (aDec > 0 ? aDecStart + 2 * aDec - 1 : aCo > 0 ? U + 1 : U - 1) : -1

  // Shoulders and neck, in stitches.
  let S = 0
  let N = 0
  let Nc = 0
  let Nd = 0
  let steps = 1
  let method: 'cast-off' | 'hold' = 'cast-off'
  if (sh) {
    S = sts(requirePositive(sh.width, 'shoulder.width'))
    if (S < 1) fail('shoulder.width', `${sh.width} cm is less than a stitch`)
    method = enumField(sh.method, 'shoulder.method', ['cast-off', 'hold'] as const)
    const dropRows = rowsOf(requireNonNegative(sh.drop, 'shoulder.drop'))
    steps = Math.floor(dropRows / 2) + 1
    if (steps > S) fail('shoulder.drop', `${dropRows} rows give ${steps} steps, more than the shoulder's ${S} stitches`)
  }
  let Nr = 0
  if (nk) {
    const shape = enumField(nk.shape, 'neck.shape', ['round', 'v', 'square'] as const)
    const Nw = sts(requirePositive(nk.width, 'neck.width'))
    if (Nw < 1) fail('neck.width', `${nk.width} cm is less than a stitch`)
    if (Nw >= P - 1) fail('neck.width', `${Nw} stitches do not fit in the ${P} across the shoulders with a stitch each side`)
    if (sh) {
      if (2 * S + Nw > P) fail('shoulder.width', `2 shoulders of ${S} and a neck of ${Nw} stitches are wider than the ${P} across the shoulders`)
      N = P - 2 * S
    }
    else {
      N = Nw + ((P - Nw) % 2)
      S = (P - N) / 2
    }
    Nd = shape === 'square' ? 0 : shape === 'round' ? Math.floor(N / 4) : Math.floor(N / 2)
    Nc = N - 2 * Nd
    const depth = requirePositive(nk.depth, 'neck.depth')
    // Parity rule: the neck's first row starts from the right and each part has an odd count.
    const p = start === 'right' ? 0 : 1
    if (T % 2 !== (p + 1) % 2) T = otherParity(T, exactTotal, 1)
    Nr = rowsOf(depth)
    if (Nr % 2 === 0) Nr = otherParity(Nr, depth * rpc / 10, 1)
    if (Nr >= T) fail('neck.depth', `${Nr} rows reach below the cast-on (the piece has ${T})`)
  }
  else if (sh) {
    if (2 * S > P) fail('shoulder.width', `2 shoulders of ${S} stitches are wider than the ${P} across the shoulders`)
    N = P - 2 * S
  }
  if (T > MAX_SHAPING_ROWS) fail('lengthToUnderarm', `${T} rows is more than ${MAX_SHAPING_ROWS}`)
  const s = nk ? T - Nr : T // first row of the parts; T when the piece stays whole

  // Sleeve cap.
  const cCo = cap ? sts(requireNonNegative(cap.castOff, 'cap.castOff')) : 0
  let capDec = 0
  let capTop = 0
  if (cap) {
    const Wc = W - 2 * cCo
    if (Wc < 1) fail('cap.castOff', `${cCo} stitches each side leave nothing of the ${W} at the upper arm`)
    const Tw = sts(requirePositive(cap.topWidth, 'cap.topWidth'))
    if (Tw < 1) fail('cap.topWidth', `${cap.topWidth} cm is less than a stitch`)
    if (Tw > Wc) fail('cap.topWidth', `${Tw} stitches are wider than the ${Wc} left after the cap's cast-off`)
    capDec = Math.floor((Wc - Tw) / 2)
    capTop = Wc - 2 * capDec
    const zone = T - 1 - (U + (cCo > 0 ? 2 : 0))
    if (zone < 0 || zone < capDec) {
      fail('cap.height', `${T - U} rows of cap do not hold its cast-off, ${capDec} decreases each side and the top's cast-off`)
    }
  }

  // The top: first row of the top shaping, and that the armhole ends below it.
  const holdExtra = method === 'hold' && steps > 1 ? 1 : 0
  const topStart = nk ? s : sh ? T - 2 * steps - holdExtra : T
  if (arm && armEnd >= T) fail('armhole.decrease', `the armhole's cast-off and decreases need ${armEnd - U + 1} rows, its depth is ${T - U}`)
  if (topStart <= armEnd || topStart < 1) {
    if (nk) fail('neck.depth', `the neck starts on row ${s + 1}, before the armhole shaping ends (row ${armEnd + 1})`)
    fail('shoulder.drop', `the shoulders start on row ${topStart + 1}, before the armhole shaping ends (row ${armEnd + 1})`)
  }

  // Each part: shoulder rows, neck-edge decrease rows.
  const M = Nr
  const castOffRowsInPart: number[] = [] // k of each shoulder step, the last on M − 1
  let firstShoulderK = 0
  if (nk) {
    for (let j = 0; j < steps; j++) castOffRowsInPart.push(M - 1 - 2 * (steps - 1 - j))
    firstShoulderK = castOffRowsInPart[0]! - holdExtra
    if (firstShoulderK < 1) {
      if (steps > 1) fail('shoulder.drop', `the shoulder's ${steps} steps need ${2 * steps - 1 + holdExtra} rows, the neck has ${M}`)
      fail('neck.depth', `${M} rows do not hold the neck's first row and the shoulder's cast-off`)
    }
    if (Nd > firstShoulderK - 1) {
      fail('neck.depth', `${Nd} decreases at each neck edge do not fit in the ${firstShoulderK - 1} rows below the shoulder`)
    }
  }

  // Side shaping zone.
  const sideRows = Math.min(U, topStart)
  if (sideSteps > sideRows) fail('width', `${sideSteps} ${widen > 0 ? 'increases' : 'decreases'} each side do not fit in ${sideRows} rows`)

  // Whole-piece events.
  const whole: Events[] = Array.from({ length: s }, blank)
  for (const r of changeRows(sideSteps, sideRows)) {
    const e = whole[r - 1]!
    if (widen > 0) e.increase = { left: 1, right: 1 }
    else e.decrease = { left: 1, right: 1 }
  }
  const pairCastOff = (r: number, n: number) => {
    whole[r]!.castOff[carriageOf(r)] += n
    whole[r + 1]!.castOff[carriageOf(r + 1)] += n
  }
  if (aCo > 0) pairCastOff(U, aCo)
  for (const r of changeRows(aDec, 2 * aDec)) whole[aDecStart + r - 1]!.decrease = { left: 1, right: 1 }
  if (cap) {
    if (cCo > 0) pairCastOff(U, cCo)
    const z = U + (cCo > 0 ? 2 : 0)
    for (const r of changeRows(capDec, T - 1 - z)) whole[z + r - 1]!.decrease = { left: 1, right: 1 }
    whole[T - 1]!.castOff[carriageOf(T - 1)] += capTop
  }
  if (sh && !nk) {
    const sizes = stepSizes(steps, S)
    for (let j = 0; j < steps; j++) {
      const a = T - 2 * steps + 2 * j
      const first = carriageOf(a)
      if (method === 'cast-off') pairCastOff(a, sizes[j]!)
      else if (j < steps - 1) {
        whole[a - 1]!.hold[first] += sizes[j]!
        whole[a]!.hold[other(first)] += sizes[j]!
      }
    }
    if (method === 'hold') {
      pairCastOff(T - 2, S)
      whole[T - 2]!.release[carriageOf(T - 2)] = true
      whole[T - 1]!.release[carriageOf(T - 1)] = true
    }
    whole[T - 1]!.castOff.centre += N
  }

  // The right part's events (k = 0 … M − 1); the left part mirrors them.
  const part: Events[] = Array.from({ length: M }, blank)
  if (nk) {
    part[0]!.castOff.centre = Nc
    for (const k of changeRows(Nd, firstShoulderK - 1)) part[k]!.decrease.left = 1
    const sizes = stepSizes(steps, S)
    castOffRowsInPart.forEach((k, j) => {
      if (method === 'cast-off') part[k]!.castOff.right = sizes[j]!
      else if (j < steps - 1) part[k - 1]!.hold.right = sizes[j]!
    })
    if (method === 'hold') {
      part[M - 1]!.castOff.right = S
      part[M - 1]!.release.right = true
    }
  }

  // Walk the rows.
  const rows: ShapedRow[] = []
  let stitches = C
  const heldAt = { left: 0, right: 0 }
  const emit = (e: Events, partName: ShapedRow['part'], carriage: Side, row: number, elsewhere: number) => {
    const co = e.castOff
    stitches += -co.left - co.right - co.centre - e.decrease.left - e.decrease.right + e.increase.left + e.increase.right
    for (const side of ['left', 'right'] as const) {
      if (e.release[side]) heldAt[side] = 0
      heldAt[side] += e.hold[side]
    }
    const own = heldAt.left + heldAt.right
    rows.push({
      part: partName,
      carriage,
      stitches,
      held: own + elsewhere,
      heldInPart: own,
      heldAt: { ...heldAt },
      row,
      castOff: { ...co },
      decrease: { ...e.decrease },
      increase: { ...e.increase },
    })
  }
  for (let r = 0; r < s; r++) emit(whole[r]!, 'whole', carriageOf(r), r, 0)
  if (nk) {
    const half = (stitches - Nc) / 2
    // The right part: its share of the bed, the left half waiting in holding position.
    stitches -= half
    for (let k = 0; k < M; k++) emit(part[k]!, 'right', carriageOf(s + k), s + k, half)
    stitches = half
    for (let k = 0; k < M; k++) {
      const e = part[k]!
      emit({
        castOff: { left: e.castOff.right, right: e.castOff.left, centre: 0 },
        decrease: { left: e.decrease.right, right: e.decrease.left },
        increase: { left: e.increase.right, right: e.increase.left },
        hold: { left: e.hold.right, right: e.hold.left },
        release: { left: e.release.right, right: e.release.left },
      }, 'left', other(carriageOf(s + k)), s + k, 0)
    }
  }

  const shapedTop = !!(nk || sh || cap)
  return {
    castOn: C,
    rows,
    leftOnNeedles: shapedTop ? 0 : stitches,
    counts: {
      rowsToUnderarm: U,
      rowsTotal: T,
      width: W,
      top: cap ? capTop : P,
      shoulder: nk || sh ? S : 0,
      neck: N,
      neckCentre: Nc,
      neckDecreases: Nd,
      neckRows: M,
    },
  }
}
