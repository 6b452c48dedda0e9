import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { shapedNeedles, shapePiece } from '#shared/engine'
import { frontSpec, gaugeArb, sleeveSpec, specArb, tryShape } from '../../support/shapeSpecs'

const g30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }

describe('shapedNeedles — where the piece sits on the bed (common practice: the edges move, the bed does not)', () => {
  it('the worked front: needles 0–149 at the cast-on, 6 out each side at the chest, the neck splits at the centre', () => {
    const piece = shapePiece(frontSpec, g30x40)
    const needles = shapedNeedles(piece)
    expect(needles[0]).toEqual({ from: 0, to: 150, knitFrom: 0, knitTo: 150 })
    // Chest 162 = 150 + 6 each side: needles −6 … 155.
    const underarm = piece.counts.rowsToUnderarm - 1
    expect(needles[underarm]).toMatchObject({ from: -6, to: 156 })
    // Across the shoulders 144: the armholes take 9 each side (cast off 6, decrease 3).
    const firstRight = piece.rows.findIndex(r => r.part === 'right')
    expect(needles[firstRight - 1]).toMatchObject({ from: 3, to: 147 })
    // The neck of 48 (centre cast-off 24, 12 decreased each side) sits on needles 51–98:
    // the right part starts after the centre, the left part ends before it.
    const c = piece.counts
    expect(c.neck).toBe(48)
    expect(needles[firstRight]).toMatchObject({ from: 3 + c.shoulder + c.neckDecreases + c.neckCentre, to: 147 })
    const firstLeft = piece.rows.findIndex(r => r.part === 'left')
    expect(needles[firstLeft]).toMatchObject({ from: 3, to: 3 + c.shoulder + c.neckDecreases })
    // Each part's last row casts off what is left.
    expect(needles[firstLeft - 1]!.to - needles[firstLeft - 1]!.from).toBe(0)
    expect(needles.at(-1)!.to - needles.at(-1)!.from).toBe(0)
  })

  it('the worked sleeve grows outwards from the cast-on needles and the cap comes in evenly', () => {
    const piece = shapePiece(sleeveSpec, g30x40)
    const needles = shapedNeedles(piece)
    expect(needles[0]).toEqual({ from: 0, to: 60, knitFrom: 0, knitTo: 60 })
    expect(needles[piece.counts.rowsToUnderarm - 1]).toMatchObject({ from: -18, to: 78 })
    // Centred on the cast-on's middle, but for the row between the two sides' cast-offs and the emptied last row.
    piece.rows.forEach((r, i) => {
      if (r.castOff.left === r.castOff.right && r.stitches > 0) expect(needles[i]!.from + needles[i]!.to).toBe(60)
    })
  })

  it('over random specs: the span holds the row\'s stitches, the knitting needles sit inside it, the parts mirror about the middle', () => {
    fc.assert(fc.property(specArb, gaugeArb, (spec, gauge) => {
      const piece = tryShape(spec, gauge)
      if (!piece) return
      const needles = shapedNeedles(piece)
      expect(needles).toHaveLength(piece.rows.length)
      piece.rows.forEach((r, i) => {
        const n = needles[i]!
        expect(n.to - n.from).toBe(r.stitches)
        expect(n.knitFrom).toBeGreaterThanOrEqual(n.from)
        expect(n.knitTo).toBeLessThanOrEqual(n.to)
        expect(n.knitTo - n.knitFrom).toBe(Math.max(0, r.stitches - r.heldInPart))
      })
      const right = piece.rows.flatMap((r, i) => (r.part === 'right' ? [needles[i]!] : []))
      const left = piece.rows.flatMap((r, i) => (r.part === 'left' ? [needles[i]!] : []))
      expect(left).toHaveLength(right.length)
      right.forEach((r, k) => {
        const l = left[k]!
        if (r.to > r.from) expect(l.from + r.to).toBe(piece.castOn)
        expect(l.to - l.from).toBe(r.to - r.from)
      })
    }), { numRuns: 300 })
  })
})
