import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { shapedNeedles, shapePiece } from '#shared/engine'
import type { ShapedPiece } from '#shared/engine'
import { motifBands, pieceDimensions, pieceOutline, polygonArea } from '#shared/planner/schematic'
import type { Point, PieceOutline } from '#shared/planner/schematic'
import { formatLength, layoutSchematic, textEm } from '#shared/planner/schematicLayout'
import { frontSpec, gaugeArb, sleeveSpec, specArb, tryShape } from '../../support/shapeSpecs'

// The schematic of the two hand-worked pieces of tests/unit/engine/shapePiece.test.ts (their
// sheets are written out there; model declared in shared/planner/schematic.ts). At 30 sts and
// 40 rows to 10 cm a stitch is 1/3 cm and a row 1/4 cm, so the points below are written as
// (stitches / 3, rows / 4): x in needles from the leftmost one knitted, y in rows from the cast-on.
const g30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }
const at = (sts: number, rows: number): Point => ({ x: sts / 3, y: rows / 4 })
const close = (points: Point[]) => points.map(p => ({ x: Math.round(p.x * 3 * 1000) / 1000, y: Math.round(p.y * 4 * 1000) / 1000 }))

describe('pieceOutline — the worked pieces by hand', () => {
  it('(a) front: 150 at the hem (6 from the left at its widest), 162 at the chest, the armholes, stepped shoulders and the neck dipping in', () => {
    const o = pieceOutline(shapePiece(frontSpec, g30x40), g30x40)
    expect(o.width).toBe(54)
    expect(o.height).toBe(56)
    expect(o.tolerance).toBeCloseTo(1 / 6) // half a stitch
    // Counter-clockwise from the hem's right corner (needle 150 of the cast-on is x = 156).
    expect(close(o.points)).toEqual(close([
      at(156, 0), // hem, right corner
      at(156.5, 23), at(161.5, 143), // increases every 24th row: one line through the steps' middles
      at(162, 145), at(156, 145), // chest corner; armhole cast-off of 6 (the carriage right on row 145)
      at(155.5, 147), at(153.5, 151), at(153, 153), // three decreases every 2nd row, then straight
      at(153, 217), // shoulder point
      at(141, 217), at(141, 219), at(129, 219), at(129, 221), at(117, 221), at(117, 224), // 4 steps of 12
      at(105, 224), // the right shoulder's top at the neck
      at(105, 219), at(104.5, 216), at(93.5, 193), at(93, 191), // the neck's right edge: straight, 12 decreases
      at(69, 191), // 24 cast off at the centre on row 191
      at(68.5, 193), at(57.5, 216), at(57, 219), at(57, 224),
      at(45, 224), at(45, 221), at(33, 221), at(33, 219), at(21, 219), at(21, 217), at(9, 217),
      at(9, 153), at(8.5, 151), at(6.5, 147), at(6, 144), at(0, 144), // left armhole (its cast-off on row 144)
      at(0.5, 143), at(5.5, 23), at(6, 0),
    ]))
    expect(o.edges.splitAt).toBe(191 / 4)
    // Row 222 (the last knitted) and 223 (its cast-off, drawn across the row before): 12 at each shoulder.
    expect(o.rows[223]).toEqual([{ part: 'left', from: 15, to: 19 }, { part: 'right', from: 35, to: 39 }])
  })

  it('(b) sleeve: cuff 60 centred on the 96 of the upper arm, the cap with its change of rate, the top 24', () => {
    const o = pieceOutline(shapePiece(sleeveSpec, g30x40), g30x40)
    expect(o.width).toBe(32)
    expect(o.height).toBe(57)
    expect(close(o.points)).toEqual(close([
      at(78, 0), at(78.5, 9), at(95.5, 179), at(96, 180), // every 10th row ×18
      at(90, 180), // cast off 6 at the right (row 180), at the left on row 181
      at(89.5, 182), at(75.5, 196), // every row ×15
      at(60.5, 226), at(60, 228), // every 2nd row ×15, the top cast off on row 227
      at(36, 228), at(35.5, 226), at(20.5, 196), at(6.5, 182), at(6, 181), at(0, 181),
      at(0.5, 179), at(17.5, 9), at(18, 0),
    ]))
    expect(o.edges.splitAt).toBeNull()
  })
})

describe('pieceDimensions — the worked pieces by hand', () => {
  it('(a) front: each value from its counts', () => {
    const dims = pieceDimensions(shapePiece(frontSpec, g30x40), g30x40, 'body')
    expect(dims.map(d => [d.key, d.name, d.count, d.of, Math.round(d.value * 1000) / 1000])).toEqual([
      ['hemWidth', 'hem width', 150, 'stitches', 50],
      ['width', 'chest', 162, 'stitches', 54],
      ['lengthToUnderarm', 'length to underarm', 144, 'rows', 36],
      ['armholeDepth', 'armhole depth', 80, 'rows', 20],
      ['totalLength', 'total length', 224, 'rows', 56],
      ['neckDepth', 'neck depth', 33, 'rows', 8.25], // 32 rows made 33 (each side an odd count)
      ['neckWidth', 'neck width', 48, 'stitches', 16],
      ['shoulderWidth', 'shoulder', 48, 'stitches', 16],
      ['acrossShoulders', 'across shoulders', 144, 'stitches', 48],
    ])
    const by = Object.fromEntries(dims.map(d => [d.key, d]))
    expect([by.hemWidth!.from, by.hemWidth!.to]).toEqual([at(6, 0), at(156, 0)]) // the cast-on's needles 0 … 150
    expect([by.width!.from, by.width!.to]).toEqual([at(0, 144), at(162, 144)])
    expect([by.neckWidth!.from, by.neckWidth!.to]).toEqual([at(57, 224), at(105, 224)]) // the neck's top corners
    expect([by.shoulderWidth!.from, by.shoulderWidth!.to]).toEqual([at(105, 224), at(153, 217)])
    expect([by.acrossShoulders!.from, by.acrossShoulders!.to]).toEqual([at(9, 217), at(153, 217)])
    expect([by.neckDepth!.from, by.neckDepth!.to]).toEqual([at(81, 191), at(81, 224)])
    expect(dims.map(d => d.side)).toEqual(['below', 'below', 'right', 'right', 'right', 'above', 'above', 'above', 'above'])
  })

  it('(b) sleeve: cuff, upper arm, length to underarm, cap height and top, sleeve length', () => {
    const dims = pieceDimensions(shapePiece(sleeveSpec, g30x40), g30x40, 'sleeve')
    expect(dims.map(d => [d.key, d.name, d.count, Math.round(d.value * 1000) / 1000])).toEqual([
      ['hemWidth', 'cuff', 60, 20],
      ['width', 'upper arm', 96, 32],
      ['lengthToUnderarm', 'length to underarm', 180, 45],
      ['capHeight', 'cap height', 48, 12],
      ['totalLength', 'sleeve length', 228, 57],
      ['capTopWidth', 'cap top', 24, 8],
    ])
    const top = dims.find(d => d.key === 'capTopWidth')!
    expect([top.from, top.to]).toEqual([at(36, 228), at(60, 228)])
  })

  it('a rectangle has its width and length only; a back names its neck and shoulders but no neck depth', () => {
    const rect = shapePiece({ kind: 'body', hemWidth: 40, lengthToUnderarm: 30 }, g30x40)
    expect(pieceDimensions(rect, g30x40, 'body').map(d => d.key)).toEqual(['hemWidth', 'lengthToUnderarm'])
    const back = shapePiece({ ...frontSpec, neck: undefined }, g30x40)
    const keys = pieceDimensions(back, g30x40, 'body').map(d => d.key)
    expect(keys).toContain('neckWidth')
    expect(keys).toContain('shoulderWidth')
    expect(keys).not.toContain('neckDepth')
  })
})

describe('motifBands', () => {
  it('a band over the armhole is as narrow as the armhole; one over the neck splits in two', () => {
    const o = pieceOutline(shapePiece(frontSpec, g30x40), g30x40)
    const [low, yoke, outside] = motifBands(o, [
      { fromRow: 0, toRow: 20, label: 'Hem band' },
      { fromRow: 130, toRow: 200, label: 'Yoke' },
      { fromRow: 300, toRow: 320, label: 'Beyond the top' },
    ])
    expect(close(low!.polygons[0]!)).toEqual(close([at(156, 0), at(156 + 0.5 * 20 / 23, 20), at(6 - 0.5 * 20 / 23, 20), at(6, 0)]))
    expect(yoke!.polygons).toHaveLength(3) // below the neck, then its left and right
    // Width at the top of the yoke's lower part (row 190): 144 stitches = 48 cm, the armhole's width.
    const whole = yoke!.polygons[0]!
    const topXs = whole.filter(p => Math.abs(p.y - 191 / 4) < 1e-9).map(p => p.x)
    expect(Math.max(...topXs) - Math.min(...topXs)).toBeCloseTo(48, 9)
    expect(outside!.polygons).toEqual([])
  })
})

/** The outline's extent across at height y (even-odd crossings of the polygon). */
function widthAt(points: Point[], y: number): number {
  const xs: number[] = []
  points.forEach((p, i) => {
    const q = points[(i + 1) % points.length]!
    if ((p.y <= y) !== (q.y <= y)) xs.push(p.x + (q.x - p.x) * (y - p.y) / (q.y - p.y))
  })
  xs.sort((a, b) => a - b)
  let w = 0
  for (let i = 0; i + 1 < xs.length; i += 2) w += xs[i + 1]! - xs[i]!
  return w
}

const shaped = fc.tuple(specArb, gaugeArb)
  .map(([spec, gauge]) => ({ spec, gauge, piece: tryShape(spec, gauge) }))
  .filter((c): c is { spec: typeof c.spec; gauge: typeof c.gauge; piece: ShapedPiece } => c.piece !== null)

describe('pieceOutline — properties over generated pieces', () => {
  it('is closed, within [0, width] × [0, height], and its rows are the needles that knit them', () => {
    fc.assert(fc.property(shaped, ({ piece, gauge }) => {
      const o: PieceOutline = pieceOutline(piece, gauge)
      const w = 10 / gauge.stitchesPer10cm
      const needles = shapedNeedles(piece)
      const left = Math.min(...needles.map(n => n.knitFrom))
      expect(o.width).toBeCloseTo((Math.max(...needles.map(n => n.knitTo)) - left) * w, 9)
      expect(o.height).toBeCloseTo(piece.counts.rowsTotal * o.rowHeight, 9)
      expect(o.points.length).toBeGreaterThanOrEqual(4)
      for (const p of o.points) {
        expect(p.x).toBeGreaterThanOrEqual(-1e-9)
        expect(p.x).toBeLessThanOrEqual(o.width + 1e-9)
        expect(p.y).toBeGreaterThanOrEqual(-1e-9)
        expect(p.y).toBeLessThanOrEqual(o.height + 1e-9)
      }
      // Every machine row that keeps stitches is its fabric row's span of the part, to the needle.
      piece.rows.forEach((r, i) => {
        if (r.stitches === 0) return
        const span = o.rows[r.row]!.find(s => s.part === r.part)!
        expect(span.from).toBeCloseTo((needles[i]!.knitFrom - left) * w, 9)
        expect(span.to).toBeCloseTo((needles[i]!.knitTo - left) * w, 9)
      })
    }), { numRuns: 150 })
  })

  it('has the knitted area within 1 % (1.5 % under 30 stitches), and at every row the row\'s width within a stitch an edge', () => {
    fc.assert(fc.property(shaped, ({ piece, gauge }) => {
      const o = pieceOutline(piece, gauge)
      const knitted = o.rows.reduce((sum, row) => sum + row.reduce((a, s) => a + s.to - s.from, 0) * o.rowHeight, 0)
      const area = polygonArea(o.points)
      expect(area).toBeGreaterThan(0) // counter-clockwise
      // A slope's first segment leans from the hem's corner to its first step's middle (a quarter
      // stitch on average over one step): on a piece under 30 stitches that reaches 1.2 %.
      expect(Math.abs(area - knitted) / knitted).toBeLessThan(piece.castOn >= 30 ? 0.01 : 0.015)
      o.rows.forEach((row, r) => {
        const across = row.reduce((a, s) => a + s.to - s.from, 0)
        // Each edge drawn within a stitch of the knitted one: two edges a part.
        expect(Math.abs(widthAt(o.points, (r + 0.5) * o.rowHeight) - across)).toBeLessThanOrEqual(2 * row.length * o.stitchWidth + 1e-9)
      })
    }), { numRuns: 150 })
  })

  it('each dimension\'s points are its value apart, and a band is its rows\' area and never leaves the outline', () => {
    fc.assert(fc.property(shaped, fc.nat(400), fc.nat(120), ({ spec, piece, gauge }, from, rows) => {
      const o = pieceOutline(piece, gauge)
      for (const d of pieceDimensions(piece, gauge, spec.kind)) {
        expect(Math.abs(d.axis === 'x' ? d.to.x - d.from.x : d.to.y - d.from.y)).toBeCloseTo(d.value, 9)
      }
      const [band] = motifBands(o, [{ fromRow: from, toRow: from + rows, label: 'B' }])
      const bandArea = band!.polygons.reduce((a, p) => a + polygonArea(p), 0)
      const bandRows = o.rows.slice(from, from + rows)
      const inRows = bandRows.reduce((sum, row) => sum + row.reduce((a, s) => a + s.to - s.from, 0) * o.rowHeight, 0)
      // The band's edges are the outline's: within a stitch an edge of the knitted rows.
      const parts = bandRows.reduce((a, row) => a + row.length, 0)
      expect(Math.abs(bandArea - inRows)).toBeLessThanOrEqual(2 * parts * o.stitchWidth * o.rowHeight + 1e-9)
      for (const p of band!.polygons.flat()) {
        expect(widthAt(o.points, Math.min(o.height - 1e-6, Math.max(1e-6, p.y)))).toBeGreaterThan(0)
      }
    }), { numRuns: 150 })
  })
})

describe('layoutSchematic', () => {
  it('keeps labels apart on each side and the viewBox around everything', () => {
    fc.assert(fc.property(shaped, fc.boolean(), ({ spec, piece, gauge }, long) => {
      const o = pieceOutline(piece, gauge)
      const dims = pieceDimensions(piece, gauge, spec.kind)
      const texts = Object.fromEntries(dims.map(d => [d.key, long ? '50 (54, 58, 62, 66) cm' : formatLength(d.value, 'cm')]))
      const l = layoutSchematic(o, dims, texts)
      const f = l.fontSize
      const boxes = l.dimensions.map((d) => {
        const half = textEm(d.text) * f / 2
        return d.label.rotate
          ? { x0: d.label.x - 0.8 * f, x1: d.label.x + 0.2 * f, y0: d.label.y - half, y1: d.label.y + half }
          : { x0: d.label.x - half, x1: d.label.x + half, y0: d.label.y - 0.8 * f, y1: d.label.y + 0.2 * f }
      })
      const v = l.viewBox
      boxes.forEach((a, i) => {
        expect(a.x0).toBeGreaterThanOrEqual(v.x - 1e-6)
        expect(a.x1).toBeLessThanOrEqual(v.x + v.width + 1e-6)
        expect(a.y0).toBeGreaterThanOrEqual(v.y - 1e-6)
        expect(a.y1).toBeLessThanOrEqual(v.y + v.height + 1e-6)
        // Outside the piece: right of it, below the hem or above the top.
        expect(a.x0 >= o.width || a.y1 <= 0 || a.y0 >= o.height).toBe(true)
        boxes.slice(i + 1).forEach((b) => {
          expect(a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1).toBe(false)
        })
      })
    }), { numRuns: 100 })
  })

  it('formats lengths: cm to a tenth, inches to a quarter', () => {
    expect([formatLength(8.25, 'cm'), formatLength(56, 'cm'), formatLength(50.8, 'in'), formatLength(0.6, 'in'), formatLength(2.54, 'in')])
      .toEqual(['8.3 cm', '56 cm', '20 in', '¼ in', '1 in'])
  })
})
