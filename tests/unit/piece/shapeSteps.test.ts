import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { atMachine, shapedNeedles, shapePiece } from '#shared/engine'
import type { ShapedPiece } from '#shared/engine'
import { partSummary, shapeStep } from '#shared/piece/shapeSteps'
import type { TimelineShape } from '#shared/piece/types'
import { bodyArb, frontSpec, gaugeArb, sleeveSpec, specArb, tryShape } from '../../support/shapeSpecs'

const g30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }
const frozen = (p: ShapedPiece, kind: 'body' | 'sleeve' = 'body'): TimelineShape => ({ size: 'M', kind, castOn: p.castOn, rows: p.rows, leftOnNeedles: p.leftOnNeedles })
const steps = (p: ShapedPiece) => {
  const shape = frozen(p)
  const needles = shapedNeedles(shape)
  return (i: number) => shapeStep(shape, needles, i)
}

describe('atMachine (common practice: a single bed shows the knitter the purl side)', () => {
  it('swaps the sides, and twice is the side it was', () => {
    expect(atMachine('left')).toBe('right')
    expect(atMachine('right')).toBe('left')
    expect(atMachine(atMachine('left'))).toBe('left')
  })
})

describe('shapeStep — the worked front (tests/unit/engine/shapePiece.test.ts), said at the machine', () => {
  // Written by hand from that sheet, every side swapped (the sheet is knit-side):
  //   row 0 (index 0): carriage at the sheet's left = the knitter's right.
  //   index 23: inc 1 each end → 152 in work.
  //   index 144: cast off 6 at the sheet's left → "at the right (carriage side)"; index 145 the other.
  //   index 191: the right part of the sheet starts = the knitter's left side of the neck:
  //     cast off the centre 24, the other 60 (the knitter's right) to holding position; 60 in work, 60 held.
  //   index 223: its last row casts off the last 12 at the sheet's right = the knitter's left.
  //   index 224: the other side: the 60 held on the knitter's right back to work, the carriage at the
  //     sheet's left = the knitter's right; 60 in work, none held.
  //   index 226 (fabric row 193): dec 1 at the sheet's right = the knitter's left, the neck edge.
  const step = steps(shapePiece(frontSpec, g30x40))

  it('knits on across the whole piece with the carriage changing side every row', () => {
    expect(step(0)).toMatchObject({ now: [], part: null, needlesInWork: 150, held: 0, carriageBefore: 'right', carriageAfter: 'left' })
    expect(step(1)).toMatchObject({ carriageBefore: 'left', carriageAfter: 'right' })
    expect(step(23).now.map(x => x.text)).toEqual(['Increase 1 each end'])
    expect(step(23).needlesInWork).toBe(152)
    expect(step(22).next.map(x => x.text)).toEqual(['Increase 1 each end'])
  })

  it('casts off at the carriage side only, one armhole a row', () => {
    expect(step(144).now.map(x => x.text)).toEqual(['Cast off 6 stitches at the right (carriage side)'])
    expect(step(144).carriageBefore).toBe('right')
    expect(step(145).now.map(x => x.text)).toEqual(['Cast off 6 stitches at the left (carriage side)'])
    expect(step(147).now.map(x => x.text)).toEqual(['Decrease 1 each end'])
  })

  it('splits the neck: the centre cast off, the other side waiting in holding position', () => {
    const s = step(191)
    expect(s.now.map(x => x.text)).toEqual([
      'Cast off the centre 24 stitches',
      'Push the 60 needles on your right to holding position',
    ])
    expect(s).toMatchObject({ part: { side: 'left', label: 'Left side of the neck', row: 1, rows: 33 }, needlesInWork: 60, held: 60 })
    expect(step(190).next).toEqual(s.now)
    expect(step(193).now.map(x => x.text)).toEqual(['Decrease 1 at the right (neck edge)'])
    expect(step(223).now.map(x => x.text)).toEqual(['Cast off the last 12 stitches at the left (carriage side)'])
    expect(step(223).part).toMatchObject({ row: 33, rows: 33 })
  })

  it('then the other side, mirrored', () => {
    const s = step(224)
    expect(s.now.map(x => x.text)).toEqual(['Now the other side: bring the 60 needles held on your right back to work', 'Join the yarn at the carriage (right)'])
    expect(s).toMatchObject({ part: { side: 'right', label: 'Right side of the neck', row: 1, rows: 33 }, needlesInWork: 60, held: 0, carriageBefore: 'right' })
    expect(step(226).now.map(x => x.text)).toEqual(['Decrease 1 at the left (neck edge)'])
    expect(step(256).now.map(x => x.text)).toEqual(['Cast off the last 12 stitches at the right (carriage side)'])
    expect(partSummary(frozen(shapePiece(frontSpec, g30x40))).map(p => [p.label, p.first, p.last])).toEqual([
      ['Whole width', 0, 190], ['Left side of the neck', 191, 223], ['Right side of the neck', 224, 256],
    ])
  })
})

describe('shapeStep — other shapes', () => {
  it('the worked sleeve: the cap cast off at each side, then the top', () => {
    const step = steps(shapePiece(sleeveSpec, g30x40))
    // Sheet: row 180 carriage right (knitter's left) casts off 6 at the right; 227 the top 24 at the left.
    expect(step(180).now.map(x => x.text)).toEqual(['Cast off 6 stitches at the left (carriage side)'])
    expect(step(181).now.map(x => x.text)).toEqual(['Cast off 6 stitches at the right (carriage side)'])
    expect(step(227).now.map(x => x.text)).toEqual(['Cast off the last 24 stitches at the right (carriage side)'])
  })

  it('shoulders by holding position: needles to hold at the outer edge, then the shoulder cast off with them', () => {
    const step = steps(shapePiece({ ...frontSpec, shoulder: { width: 16, drop: 1.5, method: 'hold' } }, g30x40))
    const rows = shapePiece({ ...frontSpec, shoulder: { width: 16, drop: 1.5, method: 'hold' } }, g30x40).rows
    const held = rows.findIndex((r, i) => i > 0 && r.part === 'right' && r.heldInPart > rows[i - 1]!.heldInPart)
    expect(step(held).now.map(x => x.text)).toContain('Push 12 needles at the left to holding position (the carriage knits towards them)')
    const last = rows.findIndex(r => r.part === 'left') - 1
    expect(step(last).now.map(x => x.text)).toEqual(['Cast off the last 48 stitches at the left (carriage side), the held needles with them'])
  })

  it('a straight top says what stays on the needles after the last row', () => {
    const p = shapePiece({ kind: 'sleeve', hemWidth: 20, width: 30, lengthToUnderarm: 40 }, g30x40)
    const shape = { ...frozen(p, 'sleeve') }
    const last = shapeStep(shape, shapedNeedles(shape), p.rows.length - 1)
    expect(last.now.map(x => x.text)).toContain('After this row 90 stitches stay on the needles: cast off or take them onto waste yarn as the plan says')
  })
})

describe('shapeStep — properties over random shapes (the rules of shared/engine/shapePiece.ts)', () => {
  it('cast-offs only at the carriage, next is the next row\'s now, needles in work from the needles, the same answer however it is reached', () => {
    fc.assert(fc.property(specArb, gaugeArb, (spec, gauge) => {
      const p = tryShape(spec, gauge)
      if (!p) return
      const shape = frozen(p)
      const needles = shapedNeedles(shape)
      for (let i = 0; i < p.rows.length; i++) {
        const s = shapeStep(shape, needles, i) // throws if a cast-off is asked away from the carriage
        for (const x of s.now) if (x.kind === 'cast-off') expect(x.text).toContain(`at the ${s.carriageBefore} (carriage side)`)
        if (i + 1 < p.rows.length) expect(s.next).toEqual(shapeStep(shape, needles, i + 1).now)
        expect(s.needlesInWork).toBe(needles[i]!.knitTo - needles[i]!.knitFrom)
        expect(s.carriageAfter).not.toBe(s.carriageBefore)
      }
    }), { numRuns: 150 })
  })

  it('every side of a neck is named, counted from 1, and as long as its mirror', () => {
    fc.assert(fc.property(bodyArb, gaugeArb, (spec, gauge) => {
      const p = tryShape(spec, gauge)
      if (!p || !p.counts.neckRows) return
      const parts = partSummary(frozen(p))
      expect(parts.map(x => x.label)).toEqual(['Whole width', 'Left side of the neck', 'Right side of the neck'])
      expect(parts[1]!.last - parts[1]!.first).toBe(parts[2]!.last - parts[2]!.first)
    }), { numRuns: 150 })
  })
})
