// A shaped piece drawn to scale: its outline, the measurements a knitter reads off it, and the
// motif's bands at the width they are knitted. Pure; lengths in cm, x from the piece's left edge
// at its widest, y up from the cast-on.
//
// Declared model:
// - Fabric rows. Fabric row r (ShapedRow.row) fills y from r·h to (r + 1)·h, h = 10 / rows per
//   10 cm, across the needles that knit it (shapedNeedles' knitFrom … knitTo: needles in holding
//   position knit no fabric, so short-row shoulders slope like stepped ones). A row whose shaping
//   casts off every stitch left (the last row of a shaped top) is drawn across the needles that
//   knitted the row before: its cast-off makes the top edge, so the piece is as long as its rows.
// - x. Needle n sits at x = (n − the leftmost needle knitted) · w, w = 10 / stitches per 10 cm.
// - Edges. Each edge (left and right outside; the two neck edges where the piece is split) is a
//   line going up. A change of one stitch (an increase, a decrease) is drawn through the middle of
//   its step; a change of more (a cast-off, needles going to holding position), and one that
//   turns back from the one-stitch steps before it, as the horizontal step it is. Among the middles between two such steps, one is dropped when it lies within
//   half a stitch, measured across at its own height, of the straight line through the middles
//   kept either side (Douglas–Peucker). So an even slope is one segment through its steps'
//   middles, a corner stays where the rate of shaping changes, the drawn edge stays within a
//   stitch of the knitted one and the area is the knitted area (a line from the hem's corner
//   instead would run half a stitch outside the whole slope). The steps' ends join the first
//   and last middle; a straight stretch there longer than two of the slope's steps keeps a
//   corner one step from the slope, so it is drawn straight rather than leaning.
// - Measurements come from the counts (castOn, counts.*, rows), not from the drawing: a
//   dimension's value is its stitches × w or rows × h, and its two points are that far apart.

import { shapedNeedles } from '#shared/engine'
import type { ShapedPiece, ShapedRow } from '#shared/engine'

export interface Point { x: number; y: number }

export interface SchematicGauge { stitchesPer10cm: number; rowsPer10cm: number }

/** One part's fabric on a row, in cm. */
export interface RowSpan { part: ShapedRow['part']; from: number; to: number }

export interface PieceOutline {
  /** Closed polygon (the first point is not repeated), counter-clockwise with y up, in cm. */
  points: Point[]
  /** The bounding box is [0, width] × [0, height]. */
  width: number
  height: number
  stitchWidth: number
  rowHeight: number
  /** Points closer than this (cm, across) to a kept line were dropped. */
  tolerance: number
  /** Per fabric row from the cast-on: each part's knitted span, left to right, in cm. */
  rows: RowSpan[][]
  /** The edges the polygon is made of, each going up (y never decreases along it). */
  edges: {
    leftOuter: Point[]
    rightOuter: Point[]
    /** Where the piece is split at a neck: the neck's left and right edges, from its bottom. */
    leftInner: Point[] | null
    rightInner: Point[] | null
    /** y of the neck's bottom, null when the piece stays whole. */
    splitAt: number | null
  }
}

interface NeedleSpan { part: ShapedRow['part']; from: number; to: number }
type Pt = [number, number] // needle position, row boundary

const partOrder = { left: 0, whole: 1, right: 2 } as const

/** Each fabric row's knitted spans in needle positions (model above). */
function needleRows(piece: ShapedPiece): NeedleSpan[][] {
  const needles = shapedNeedles(piece)
  const rows: NeedleSpan[][] = []
  piece.rows.forEach((r, i) => {
    let n = needles[i]!
    if (r.stitches === 0) {
      if (i === 0 || piece.rows[i - 1]!.part !== r.part) return
      n = needles[i - 1]!
    }
    if (n.knitTo <= n.knitFrom) return
    ;(rows[r.row] ??= []).push({ part: r.part, from: n.knitFrom, to: n.knitTo })
  })
  const dense: NeedleSpan[][] = []
  for (let r = 0; r < rows.length && rows[r]; r++) dense.push(rows[r]!.sort((a, b) => partOrder[a.part] - partOrder[b.part]))
  return dense
}

/** Horizontal distance from p to the line through a and b (a[1] < b[1]). */
function across(p: Pt, a: Pt, b: Pt): number {
  if (b[1] === a[1]) return Math.hypot(p[0] - a[0], p[1] - a[1])
  return Math.abs(p[0] - (a[0] + (b[0] - a[0]) * (p[1] - a[1]) / (b[1] - a[1])))
}

function douglasPeucker(pts: Pt[], tolerance: number): Pt[] {
  if (pts.length <= 2) return pts
  const a = pts[0]!
  const b = pts[pts.length - 1]!
  let worst = 0
  let at = 0
  for (let i = 1; i < pts.length - 1; i++) {
    const d = across(pts[i]!, a, b)
    if (d > worst) { worst = d; at = i }
  }
  if (worst <= tolerance) return [a, b]
  return [...douglasPeucker(pts.slice(0, at + 1), tolerance).slice(0, -1), ...douglasPeucker(pts.slice(at), tolerance)]
}

/** An edge going up from row r0, one x per row, as simplified points (needles, rows). */
function edgePoints(xs: number[], r0: number, tolerance: number): Pt[] {
  // Runs of points between fixed ones (the ends and both ends of every step of more than a stitch).
  const runs: Pt[][] = [[[xs[0]!, r0]]]
  const fix = (p: Pt) => { runs[runs.length - 1]!.push(p); runs.push([p]) }
  let way = 0 // the direction of the last one-stitch step in this run
  for (let i = 1; i < xs.length; i++) {
    const before = xs[i - 1]!
    const now = xs[i]!
    if (now === before) continue
    const d = now - before
    if (Math.abs(d) <= 1 && way * d >= 0) {
      runs[runs.length - 1]!.push([(before + now) / 2, r0 + i])
      way = d
    }
    else {
      fix([before, r0 + i]); fix([now, r0 + i])
      way = 0
    }
  }
  runs[runs.length - 1]!.push([xs[xs.length - 1]!, r0 + xs.length])
  const out: Pt[] = []
  for (const run of runs) {
    if (run.length < 2) continue
    // The middles are simplified among themselves; the fixed ends join the first and last of
    // them, so a slope's line runs through its steps' middles and the area stays the knitted one.
    // A straight stretch at either end longer than twice the slope's step stays straight up to
    // a step from the slope (a corner), rather than leaning half a stitch all the way.
    const a = run[0]!
    const b = run[run.length - 1]!
    const middles = run.slice(1, -1)
    const kept: Pt[] = [a]
    if (middles.length) {
      const first = middles[0]!
      const last = middles[middles.length - 1]!
      const stepIn = middles.length > 1 ? middles[1]![1] - first[1] : b[1] - first[1]
      const stepOut = middles.length > 1 ? last[1] - middles[middles.length - 2]![1] : first[1] - a[1]
      if (first[1] - a[1] > 2 * stepIn) kept.push([a[0], first[1] - stepIn])
      kept.push(...douglasPeucker(middles, tolerance))
      if (b[1] - last[1] > 2 * stepOut) kept.push([b[0], last[1] + stepOut])
    }
    kept.push(b)
    out.push(...(out.length ? kept.slice(1) : kept))
  }
  return out
}

function dedupe(points: Point[]): Point[] {
  const out: Point[] = []
  for (const p of points) {
    const last = out[out.length - 1]
    if (!last || Math.abs(last.x - p.x) > 1e-9 || Math.abs(last.y - p.y) > 1e-9) out.push(p)
  }
  while (out.length > 1 && Math.abs(out[0]!.x - out[out.length - 1]!.x) < 1e-9 && Math.abs(out[0]!.y - out[out.length - 1]!.y) < 1e-9) out.pop()
  return out
}

function scale(gauge: SchematicGauge) {
  return { w: 10 / gauge.stitchesPer10cm, h: 10 / gauge.rowsPer10cm }
}

/** The piece's outline to scale (model above): one polygon, whose top dips into the neck when it has one. */
export function pieceOutline(piece: ShapedPiece, gauge: SchematicGauge): PieceOutline {
  const { w, h } = scale(gauge)
  const rows = needleRows(piece)
  const left = Math.min(...rows.map(r => r[0]!.from))
  const right = Math.max(...rows.map(r => r[r.length - 1]!.to))
  const toCm = (pts: Pt[]): Point[] => pts.map(([x, y]) => ({ x: (x - left) * w, y: y * h }))
  const split = rows.findIndex(r => r.length > 1)
  const tolerance = 0.5 // stitch

  const leftOuter = toCm(edgePoints(rows.map(r => r[0]!.from), 0, tolerance))
  const rightOuter = toCm(edgePoints(rows.map(r => r[r.length - 1]!.to), 0, tolerance))
  let leftInner: Point[] | null = null
  let rightInner: Point[] | null = null
  let points: Point[]
  if (split >= 0) {
    const parts = rows.slice(split)
    leftInner = toCm(edgePoints(parts.map(r => r[0]!.to), split, tolerance))
    rightInner = toCm(edgePoints(parts.map(r => r[r.length - 1]!.from), split, tolerance))
    points = [...rightOuter, ...[...rightInner].reverse(), ...leftInner, ...[...leftOuter].reverse()]
  }
  else points = [...rightOuter, ...[...leftOuter].reverse()]

  return {
    points: dedupe(points),
    width: (right - left) * w,
    height: rows.length * h,
    stitchWidth: w,
    rowHeight: h,
    tolerance: tolerance * w,
    rows: rows.map(r => r.map(s => ({ part: s.part, from: (s.from - left) * w, to: (s.to - left) * w }))),
    edges: { leftOuter, rightOuter, leftInner, rightInner, splitAt: split >= 0 ? split * h : null },
  }
}

/** Twice the signed area of a polygon (positive counter-clockwise). */
export function polygonArea(points: Point[]): number {
  let a = 0
  points.forEach((p, i) => {
    const q = points[(i + 1) % points.length]!
    a += p.x * q.y - q.x * p.y
  })
  return a / 2
}

// ---------------------------------------------------------------------------------------------
// Dimensions

export const dimensionKeys = [
  'hemWidth', 'width', 'lengthToUnderarm', 'armholeDepth', 'capHeight', 'totalLength',
  'acrossShoulders', 'shoulderWidth', 'neckWidth', 'neckDepth', 'capTopWidth',
] as const
export type DimensionKey = typeof dimensionKeys[number]

export interface Dimension {
  key: DimensionKey
  /** What a knitter calls it on this kind of piece ("chest", "upper arm"). */
  name: string
  /** 'x' measures across, 'y' up the piece. */
  axis: 'x' | 'y'
  /** Where the line goes: below the hem, right of the piece, above the top. */
  side: 'below' | 'right' | 'above'
  /** The two points on the piece it measures between (cm); |to − from| along the axis is the value. */
  from: Point
  to: Point
  /** cm, from the counts. */
  value: number
  count: number
  of: 'stitches' | 'rows'
}

const names: Record<'body' | 'sleeve', Record<DimensionKey, string>> = {
  body: {
    hemWidth: 'hem width', width: 'chest', lengthToUnderarm: 'length to underarm', armholeDepth: 'armhole depth', capHeight: 'cap height',
    totalLength: 'total length', acrossShoulders: 'across shoulders', shoulderWidth: 'shoulder', neckWidth: 'neck width', neckDepth: 'neck depth',
    capTopWidth: 'cap top',
  },
  sleeve: {
    hemWidth: 'cuff', width: 'upper arm', lengthToUnderarm: 'length to underarm', armholeDepth: 'armhole depth', capHeight: 'cap height',
    totalLength: 'sleeve length', acrossShoulders: 'across shoulders', shoulderWidth: 'shoulder', neckWidth: 'neck width', neckDepth: 'neck depth',
    capTopWidth: 'cap top',
  },
}

/**
 * The dimension lines of a schematic, in reading order. The piece does not say what it is, so the
 * kind names them; a body's top more than a row above its underarm is an armhole (a drop
 * shoulder's top is within the neck's one row of it), a sleeve's top above it a cap.
 */
export function pieceDimensions(piece: ShapedPiece, gauge: SchematicGauge, kind: 'body' | 'sleeve'): Dimension[] {
  const { w, h } = scale(gauge)
  const rows = needleRows(piece)
  const left = Math.min(...rows.map(r => r[0]!.from))
  const x = (n: number) => (n - left) * w
  const outerFrom = (r: number) => rows[Math.min(r, rows.length - 1)]![0]!.from
  const outerTo = (r: number) => { const row = rows[Math.min(r, rows.length - 1)]!; return row[row.length - 1]!.to }
  const c = piece.counts
  const U = c.rowsToUnderarm
  const T = c.rowsTotal
  const top = rows.length - 1
  const out: Dimension[] = []
  const add = (key: DimensionKey, axis: Dimension['axis'], side: Dimension['side'], from: Point, to: Point, count: number) => {
    out.push({ key, name: names[kind][key], axis, side, from, to, value: count * (axis === 'x' ? w : h), count, of: axis === 'x' ? 'stitches' : 'rows' })
  }
  const shaped = kind === 'body' ? T - U > 1 : T > U

  /** The highest row at or below `r` as wide as `stitches` outside (r when none is). */
  const widest = (r: number, stitches: number) => {
    for (let k = Math.min(r, top); k >= 0; k--) if (outerTo(k) - outerFrom(k) === stitches) return k
    return r
  }
  add('hemWidth', 'x', 'below', { x: x(0), y: 0 }, { x: x(piece.castOn), y: 0 }, piece.castOn) // the cast-on's needles
  if (c.width !== piece.castOn || shaped) {
    // The chest's row: the last below the underarm (a drop shoulder's may be in its shaped top).
    const r = widest(U - 1, c.width)
    add('width', 'x', 'below', { x: x(outerFrom(r)), y: (r + 1) * h }, { x: x(outerTo(r)), y: (r + 1) * h }, c.width)
  }
  add('lengthToUnderarm', 'y', 'right', { x: x(piece.castOn), y: 0 }, { x: x(outerTo(U - 1)), y: U * h }, U)
  if (shaped) {
    add(kind === 'body' ? 'armholeDepth' : 'capHeight', 'y', 'right', { x: x(outerTo(U - 1)), y: U * h }, { x: x(outerTo(top)), y: T * h }, T - U)
    add('totalLength', 'y', 'right', { x: x(piece.castOn), y: 0 }, { x: x(outerTo(top)), y: T * h }, T)
  }
  if (kind === 'sleeve') {
    if (shaped) add('capTopWidth', 'x', 'above', { x: x(outerFrom(top)), y: T * h }, { x: x(outerTo(top)), y: T * h }, c.top)
    return out
  }

  // The shoulder point: the highest row still as wide as across the shoulders.
  const sp = widest(top, c.top)
  const xR = x(outerTo(sp))
  const ySp = (sp + 1) * h
  if (c.neckRows > 0) {
    const centre = xR - (c.shoulder + c.neck / 2) * w
    add('neckDepth', 'y', 'above', { x: centre, y: (T - c.neckRows) * h }, { x: centre, y: T * h }, c.neckRows)
  }
  if (c.neck > 0) add('neckWidth', 'x', 'above', { x: xR - (c.shoulder + c.neck) * w, y: T * h }, { x: xR - c.shoulder * w, y: T * h }, c.neck)
  if (c.shoulder > 0) add('shoulderWidth', 'x', 'above', { x: xR - c.shoulder * w, y: T * h }, { x: xR, y: ySp }, c.shoulder)
  if (c.top !== c.width) add('acrossShoulders', 'x', 'above', { x: x(outerFrom(sp)), y: ySp }, { x: xR, y: ySp }, c.top)
  return out
}

// ---------------------------------------------------------------------------------------------
// Motif bands

export interface MotifSection {
  /** Fabric rows from the cast-on, 0-based: fromRow is the band's first, toRow the one after its last. */
  fromRow: number
  toRow: number
  label: string
}

export interface MotifBand {
  label: string
  fromRow: number
  toRow: number
  /** y range drawn (cm), inside the piece. */
  bottom: number
  top: number
  /** The band inside the outline: one polygon below the neck, one per side above it. */
  polygons: Point[][]
}

/** x where an upward edge is at height y: its first or last point there (an edge may step across at y). */
function edgeAt(edge: Point[], y: number, which: 'first' | 'last'): number {
  const eps = 1e-9
  if (which === 'first') {
    for (let i = 0; i < edge.length; i++) {
      const p = edge[i]!
      if (Math.abs(p.y - y) < eps) return p.x
      const q = edge[i + 1]
      if (q && p.y < y && q.y > y) return p.x + (q.x - p.x) * (y - p.y) / (q.y - p.y)
    }
  }
  else {
    for (let i = edge.length - 1; i >= 0; i--) {
      const p = edge[i]!
      if (Math.abs(p.y - y) < eps) return p.x
      const q = edge[i - 1]
      if (q && p.y > y && q.y < y) return q.x + (p.x - q.x) * (y - q.y) / (p.y - q.y)
    }
  }
  return y <= edge[0]!.y ? edge[0]!.x : edge[edge.length - 1]!.x
}

/** The part of an upward edge between heights y0 < y1. */
function clipEdge(edge: Point[], y0: number, y1: number): Point[] {
  const eps = 1e-9
  return [
    { x: edgeAt(edge, y0, 'last'), y: y0 },
    ...edge.filter(p => p.y > y0 + eps && p.y < y1 - eps),
    { x: edgeAt(edge, y1, 'first'), y: y1 },
  ]
}

function slab(leftEdge: Point[], rightEdge: Point[], y0: number, y1: number): Point[] | null {
  const top = Math.min(leftEdge[leftEdge.length - 1]!.y, rightEdge[rightEdge.length - 1]!.y, y1)
  const bottom = Math.max(leftEdge[0]!.y, rightEdge[0]!.y, y0)
  if (top - bottom < 1e-9) return null
  return dedupe([...clipEdge(rightEdge, bottom, top), ...clipEdge(leftEdge, bottom, top).reverse()])
}

/** Each motif section's band clipped to the outline, at the width its rows are knitted. */
export function motifBands(outline: PieceOutline, sections: MotifSection[]): MotifBand[] {
  const h = outline.rowHeight
  const { leftOuter, rightOuter, leftInner, rightInner, splitAt } = outline.edges
  return sections.map((s) => {
    const bottom = Math.max(0, s.fromRow * h)
    const top = Math.min(outline.height, s.toRow * h)
    const polygons: Point[][] = []
    if (top > bottom) {
      const below = splitAt ?? Infinity
      if (bottom < below) {
        const p = slab(leftOuter, rightOuter, bottom, Math.min(top, below))
        if (p) polygons.push(p)
      }
      if (leftInner && rightInner && top > below) {
        for (const [l, r] of [[leftOuter, leftInner], [rightInner, rightOuter]] as const) {
          const p = slab(l, r, Math.max(bottom, below), top)
          if (p) polygons.push(p)
        }
      }
    }
    return { label: s.label, fromRow: s.fromRow, toRow: s.toRow, bottom, top: Math.max(bottom, top), polygons }
  })
}
