// Where a schematic's lines and labels go: everything in SVG user units of 1 cm (y down, the
// piece's top at 0 and its hem at its height), so the picture is to scale and a print can give
// it a physical size.
//
// Declared rules:
// - Text is a fixed share of the piece, (width + height) / 40 cm, so it stays in proportion at
//   any size (about 12 px for a jumper front in a 320 px panel).
// - Each dimension goes on its side in tiers (rows of lines outward from the piece): the first
//   tier where neither its line nor its label meets a line or label already there. Labels are
//   sized by an estimate of the glyphs (about 0.56 em a digit), so a label wider than its line
//   moves outward rather than over its neighbour.
// - Below and above: a horizontal line with its label centred on it (below the line under the
//   hem, above it over the top), extension lines from the piece's points; a label is moved left
//   so it ends before the piece's right edge. Right: a vertical line with its label turned to
//   read upwards, moved to stay beside the piece's height. So labels of different sides never meet. The neck's depth is a line inside the neck; its label
//   goes on the tiers above, with a leader up to it.

import { cmToIn } from '#shared/engine'
import type { Dimension, DimensionKey, MotifBand, PieceOutline, Point } from '#shared/planner/schematic'

/** A length for a label: cm to a tenth ("8.3 cm"), inches to a quarter ("19¾ in"). */
export function formatLength(cm: number, unit: 'cm' | 'in'): string {
  if (unit === 'cm') return `${Math.round(cm * 10) / 10} cm`
  const quarters = Math.round(cmToIn(cm) * 4)
  const whole = Math.floor(quarters / 4)
  const part = ['', '¼', '½', '¾'][quarters % 4]!
  return `${whole || !part ? whole : ''}${part} in`
}

export interface LaidDimension {
  key: DimensionKey
  text: string
  /** The dimension line. */
  line: [Point, Point]
  /** Extension lines and leaders. */
  guides: [Point, Point][]
  /** Arrowheads, as one path. */
  arrows: string
  label: { x: number; y: number; rotate: boolean }
}

export interface SchematicLayout {
  viewBox: { x: number; y: number; width: number; height: number }
  fontSize: number
  outline: string
  bands: { label: string; path: string; labelAt: Point | null }[]
  dimensions: LaidDimension[]
}

const round = (v: number) => Math.round(v * 1000) / 1000
const pathOf = (points: Point[]) => `M${points.map(p => `${round(p.x)} ${round(p.y)}`).join('L')}Z`

/** Estimated width of a label in em. */
export function textEm(text: string): number {
  let em = 0
  for (const ch of text) em += /[\s.,:;()'’|]/.test(ch) ? 0.3 : /[mwMW]/.test(ch) ? 0.85 : /[A-Z]/.test(ch) ? 0.66 : 0.56
  return em
}

interface Occupied { from: number; to: number }
const clash = (a: Occupied, b: Occupied, gap: number) => a.from < b.to + gap && b.from < a.to + gap

/** Lay out a schematic: the outline, its bands and its dimensions with their texts. */
export function layoutSchematic(
  outline: PieceOutline,
  dimensions: Dimension[],
  texts: Partial<Record<DimensionKey, string>>,
  bands: MotifBand[] = [],
): SchematicLayout {
  const W = outline.width
  const H = outline.height
  const f = Math.max(0.5, (W + H) / 40)
  const flip = (p: Point): Point => ({ x: p.x, y: H - p.y })
  const gap = 0.9 * f
  const tierStep = 2.1 * f
  const rightStep = 1.9 * f
  const arrow = 0.55 * f
  const tiers: Record<Dimension['side'], { lines: Occupied[]; labels: Occupied[] }[]> = { below: [], above: [], right: [] }
  const box = { x0: 0, y0: 0, x1: W, y1: H }
  const grow = (x: number, y: number) => {
    box.x0 = Math.min(box.x0, x); box.x1 = Math.max(box.x1, x)
    box.y0 = Math.min(box.y0, y); box.y1 = Math.max(box.y1, y)
  }

  /** The first tier on a side where this line and label fit. */
  const tierFor = (side: Dimension['side'], line: Occupied | null, label: Occupied): number => {
    for (let t = 0; ; t++) {
      const here = tiers[side][t] ??= { lines: [], labels: [] }
      const lineClash = line !== null && (here.lines.some(o => clash(o, line, -1e-6)) || here.labels.some(o => clash(o, line, 0)))
      if (lineClash || here.labels.some(o => clash(o, label, 0.4 * f)) || here.lines.some(o => clash(o, label, 0))) continue
      if (line) here.lines.push(line)
      here.labels.push(label)
      return t
    }
  }

  const arrowHead = (tip: Point, towards: Point) => {
    const len = Math.hypot(towards.x - tip.x, towards.y - tip.y) || 1
    const ux = (towards.x - tip.x) / len
    const uy = (towards.y - tip.y) / len
    const a = Math.min(arrow, len / 2.5)
    const bx = tip.x + ux * a
    const by = tip.y + uy * a
    const s = a * 0.32
    return `M${round(tip.x)} ${round(tip.y)}L${round(bx - uy * s)} ${round(by + ux * s)}L${round(bx + uy * s)} ${round(by - ux * s)}Z`
  }
  const arrowsOf = (a: Point, b: Point) => arrowHead(a, b) + arrowHead(b, a)

  const laid: LaidDimension[] = []
  for (const d of dimensions) {
    const text = texts[d.key] ?? formatLength(d.value, 'cm')
    const tw = textEm(text) * f
    const a = flip(d.from)
    const b = flip(d.to)
    if (d.side === 'right') {
      const y0 = Math.min(a.y, b.y)
      const y1 = Math.max(a.y, b.y)
      // Kept beside the piece's height where it fits, clear of the labels above and below.
      const mid = tw >= H ? H / 2 : Math.min(H - tw / 2, Math.max(tw / 2, (y0 + y1) / 2))
      const t = tierFor('right', { from: y0, to: y1 }, { from: mid - tw / 2, to: mid + tw / 2 })
      const x = W + gap + t * rightStep
      const line: [Point, Point] = [{ x, y: y1 }, { x, y: y0 }]
      const over = 0.3 * f
      laid.push({
        key: d.key, text, line, arrows: arrowsOf(line[0], line[1]),
        guides: [[a, { x: x + over, y: a.y }], [b, { x: x + over, y: b.y }]],
        label: { x: x + 1.05 * f, y: mid, rotate: true },
      })
      grow(x + 1.3 * f, mid - tw / 2); grow(x + 1.3 * f, mid + tw / 2); grow(x, y0); grow(x, y1)
      continue
    }
    if (d.axis === 'y') {
      // The neck's depth: its line inside the neck, its label above with a leader.
      const cx = Math.min(W - tw / 2, a.x)
      const t = tierFor('above', null, { from: cx - tw / 2, to: cx + tw / 2 })
      const ly = -(gap + t * tierStep)
      const line: [Point, Point] = [a, b]
      laid.push({
        key: d.key, text, line, arrows: arrowsOf(a, b),
        guides: [[b, { x: b.x, y: ly - 0.1 * f }]],
        label: { x: cx, y: ly - 0.35 * f, rotate: false },
      })
      grow(cx - tw / 2, ly - 1.2 * f); grow(cx + tw / 2, ly)
      continue
    }
    const x0 = Math.min(a.x, b.x)
    const x1 = Math.max(a.x, b.x)
    // Kept left of the piece's right edge, clear of the labels on the right.
    const mid = Math.min(W - tw / 2, (x0 + x1) / 2)
    const t = tierFor(d.side, { from: x0, to: x1 }, { from: mid - tw / 2, to: mid + tw / 2 })
    const below = d.side === 'below'
    const y = below ? H + gap + t * tierStep : -(gap + t * tierStep)
    const over = below ? 0.3 * f : -0.3 * f
    const line: [Point, Point] = [{ x: x0, y }, { x: x1, y }]
    const [left, right] = a.x <= b.x ? [a, b] : [b, a]
    laid.push({
      key: d.key, text, line, arrows: arrowsOf(line[0], line[1]),
      guides: [[left, { x: x0, y: y + over }], [right, { x: x1, y: y + over }]],
      label: { x: mid, y: below ? y + 1.15 * f : y - 0.35 * f, rotate: false },
    })
    grow(mid - tw / 2, below ? y + 1.4 * f : y - 1.2 * f); grow(mid + tw / 2, y); grow(x0, y); grow(x1, y)
  }

  const laidBands = bands.filter(b => b.polygons.length).map((b) => {
    const path = b.polygons.map(p => pathOf(p.map(flip))).join('')
    // A label where the band has room for it, inside its left edge at mid-height.
    const small = 0.75 * f
    const midY = (b.bottom + b.top) / 2
    const spans = outline.rows.slice(Math.floor((midY - 0.5 * small) / outline.rowHeight), Math.ceil((midY + 0.6 * small) / outline.rowHeight))
    const from = Math.max(...spans.map(r => r[0]!.from))
    const to = Math.min(...spans.map(r => r[0]!.to))
    const x = from + 0.4 * f
    const fits = b.label !== '' && spans.length > 0 && b.top - b.bottom >= 1.5 * small && x + textEm(b.label) * small + 0.4 * f <= to
    return { label: b.label, path, labelAt: fits ? { x, y: H - midY + 0.35 * small } : null }
  })

  const m = 0.4 * f
  return {
    viewBox: { x: round(box.x0 - m), y: round(box.y0 - m), width: round(box.x1 - box.x0 + 2 * m), height: round(box.y1 - box.y0 + 2 * m) },
    fontSize: round(f),
    outline: pathOf(outline.points.map(flip)),
    bands: laidBands,
    dimensions: laid,
  }
}
