import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { shapedNeedles, shapePiece } from '#shared/engine'
import type { ShapedPiece, ShapeSpec } from '#shared/engine'
import { machineSide, partOfRow, partSummary, shapeStep } from '#shared/piece/shapeSteps'
import type { ShapeStep } from '#shared/piece/shapeSteps'
import type { TimelineShape } from '#shared/piece/types'
import { frontSpec, gaugeArb, sleeveSpec, specArb, tryShape } from '../../support/shapeSpecs'

const g30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }
const frozen = (piece: ShapedPiece, kind: ShapeSpec['kind']): TimelineShape =>
  ({ size: 'M', kind, castOn: piece.castOn, rows: piece.rows, leftOnNeedles: piece.leftOnNeedles })
const stepper = (spec: ShapeSpec) => {
  const piece = shapePiece(spec, g30x40)
  const shape = frozen(piece, spec.kind)
  const needles = shapedNeedles(piece)
  return { shape, needles, at: (i: number) => shapeStep(shape, needles, i) }
}
const texts = (s: ShapeStep, which: 'now' | 'next' = 'now') => s[which].map(x => x.text)

describe('machineSide — the one rule for sides at the machine (common practice: a single bed faces the knitter with the purl side)', () => {
  it('swaps the engine\'s knit-side names', () => {
    expect([machineSide('left'), machineSide('right')]).toEqual(['right', 'left'])
  })
})

// ---------------------------------------------------------------------------------------------
// (a) The front worked by hand in tests/unit/engine/shapePiece.test.ts (its sheet is there; the
//     sheet names sides from the knit side). Written out here first as the knitter reads them at
//     the machine, every side swapped (the knitter faces the purl side):
//
//     index  sheet (knit side)                           at the machine
//     143    right, inc 1 each end                       "Increase 1 each end"; carriage right → left
//     144    left, cast off 6 at left                    "Cast off 6 at the right (carriage side)"; 156 in work
//     145    right, cast off 6 at right                  "Cast off 6 at the left (carriage side)"; 150 in work
//     147    right, dec 1 each end                       "Decrease 1 each end"; 148 in work
//     191    right part row 1 of 33: centre 24 off,      "Cast off the centre 24 stitches",
//            60 at left to holding                       "Push the right 60 needles to holding position" (with the note
//                                                        to set the carriage); "Left side of neck", 1 of 33;
//                                                        60 in work, 60 held; carriage left → right
//     193    dec 1 at neck edge (left)                   "Decrease 1 at the right (neck edge)"
//     217    cast off 12 at right (shoulder step 1)      "Cast off 12 at the left (carriage side)"; part row 27; 36 in work
//     223    cast off 12 at right, 0 left                "Cast off the last 12 stitches of the shoulder at the left
//                                                        (carriage side)"; 33 of 33; 0 in work; carriage left → right
//     224    left part row 1: back into work, yarn in    "Now the right side: bring the 60 held needles back to work",
//                                                        "Join the yarn at the right edge, where the carriage is";
//                                                        "Right side of neck", 1 of 33; 60 in work, 0 held; carriage right
//     250    cast off 12 at left (fabric row 217)        "Cast off 12 at the right (carriage side)"
//     256    cast off 12 at left, the piece's last row   "Cast off the last 12 stitches of the shoulder at the right
//                                                        (carriage side)"; next: nothing (no stitches left)
// ---------------------------------------------------------------------------------------------
describe('shapeStep — the hand-worked front (common practice)', () => {
  const { at } = stepper(frontSpec)

  it.each([
    [143, ['Increase 1 each end'], 162, 'left'],
    [144, ['Cast off 6 at the right (carriage side)'], 156, 'right'],
    [145, ['Cast off 6 at the left (carriage side)'], 150, 'left'],
    [147, ['Decrease 1 each end'], 148, 'left'],
    [193, ['Decrease 1 at the right (neck edge)'], 59, 'left'],
    [217, ['Cast off 12 at the left (carriage side)'], 36, 'left'],
    [250, ['Cast off 12 at the right (carriage side)'], 36, 'right'],
    [256, ['Cast off the last 12 stitches of the shoulder at the right (carriage side)'], 0, 'right'],
    [0, [], 150, 'right'],
    [100, [], 158, 'right'],
  ])('row index %i: %j, %i needles in work, carriage starting at the %s', (i, now, inWork, carriage) => {
    const s = at(i)
    expect(texts(s)).toEqual(now)
    expect(s.needlesInWork).toBe(inWork)
    expect(s.carriageBefore).toBe(carriage)
    expect(s.carriageAfter).toBe(carriage === 'left' ? 'right' : 'left')
  })

  it('the first neck row: the centre cast off, the other side to holding position, the part named as the knitter sees it', () => {
    const s = at(191)
    expect(texts(s)).toEqual([
      'Cast off the centre 24 stitches',
      'Push the right 60 needles to holding position',
    ])
    expect(s.now[1]!.note).toBe('Set the carriage to pass over needles in holding position.')
    expect(s.part).toEqual({ kind: 'right', side: 'left', label: 'Left side of neck', row: 1, rows: 33 })
    expect([s.needlesInWork, s.held, s.carriageBefore, s.carriageAfter]).toEqual([60, 60, 'left', 'right'])
    // Shown a row ahead.
    expect(texts(at(190), 'next')).toEqual(texts(s))
    expect(at(190).part).toBeNull()
  })

  it('the last row of the first part, then the second part', () => {
    const end = at(223)
    expect(texts(end)).toEqual(['Cast off the last 12 stitches of the shoulder at the left (carriage side)'])
    expect(end.part).toMatchObject({ label: 'Left side of neck', row: 33, rows: 33 })
    expect([end.needlesInWork, end.held, end.carriageAfter]).toEqual([0, 60, 'right'])
    const start = at(224)
    expect(texts(end, 'next')).toEqual(texts(start))
    expect(texts(start)).toEqual([
      'Now the right side: bring the 60 held needles back to work',
      'Join the yarn at the right edge, where the carriage is',
    ])
    expect(start.part).toEqual({ kind: 'left', side: 'right', label: 'Right side of neck', row: 1, rows: 33 })
    expect([start.needlesInWork, start.held, start.carriageBefore]).toEqual([60, 0, 'right'])
  })

  it('the last row of the piece: nothing after it, the top is cast off in the rows', () => {
    const s = at(256)
    expect([s.last, s.next]).toEqual([true, []])
    expect(at(257)).toMatchObject({ finished: true, now: [], next: [] })
  })

  it('partSummary: three parts with their machine and fabric rows', () => {
    const { shape } = stepper(frontSpec)
    const spans = partSummary(shape)
    expect(spans.map(s => [s.kind, s.side, s.label, s.firstRow, s.lastRow, s.rows, s.fabricFrom, s.fabricTo])).toEqual([
      ['whole', null, 'Below the neck', 0, 190, 191, 0, 190],
      ['right', 'left', 'Left side of neck', 191, 223, 33, 191, 223],
      ['left', 'right', 'Right side of neck', 224, 256, 33, 191, 223],
    ])
    expect([partOfRow(spans, 230)?.label, partOfRow(spans, 257)]).toEqual(['Right side of neck', null])
  })
})

// (a') The same front with the shoulders shaped by holding position: per the engine's test, the
//      first part holds 12 more needles at the shoulder (knit side: right; at the machine: left)
//      before rows 216, 218 and 220 and casts off all 48 on row 223, the 36 held ones with them.
describe('shapeStep — shoulders by holding position (common practice)', () => {
  const { at } = stepper({ ...frontSpec, shoulder: { width: 16, drop: 1.5, method: 'hold' } })

  it.each([
    [216, ['Push 12 needles at the left to holding position'], 36, 72],
    [218, ['Push 12 needles at the left to holding position'], 24, 84],
    [220, ['Push 12 needles at the left to holding position'], 12, 96],
    [222, [], 12, 96],
    [223, ['Cast off all 48 stitches of the shoulder at the left (carriage side), the 36 held ones included'], 0, 60],
    [218 + 33, ['Push 12 needles at the right to holding position'], 24, 24],
    [223 + 33, ['Cast off all 48 stitches of the shoulder at the right (carriage side), the 36 held ones included'], 0, 0],
  ])('row index %i: %j, %i in work, %i held', (i, now, inWork, held) => {
    const s = at(i)
    expect(texts(s)).toEqual(now)
    expect([s.needlesInWork, s.held]).toEqual([inWork, held])
  })

  it('the first short row of the second part says how the carriage is set (nothing was held before)', () => {
    const { at: atHold } = stepper({ ...frontSpec, shoulder: { width: 16, drop: 1.5, method: 'hold' } })
    // The second part's first hold is on the row mirroring 216 (index 249): the row before holds nothing.
    expect(texts(atHold(249))).toEqual(['Push 12 needles at the right to holding position'])
    expect(atHold(249).now[0]!.note).toBe('Set the carriage to pass over needles in holding position.')
    // In the first part the other side's needles are held already: no note.
    expect(atHold(216).now[0]!.note).toBeUndefined()
    expect(atHold(248).held).toBe(0)
  })
})

// (b) The sleeve of the engine's sheet (carriage at the right on the knit side, so at the
//     machine row 0 starts at the left): increases every 10th row, the cap's cast-offs on rows
//     180 (knit side right → at the machine left) and 181, the top's 24 off on row 227.
describe('shapeStep — the hand-worked sleeve cap (common practice)', () => {
  const { at } = stepper(sleeveSpec)

  it.each([
    [0, [], 'left', 60],
    [9, ['Increase 1 each end'], 'right', 62],
    [180, ['Cast off 6 at the left (carriage side)'], 'left', 90],
    [181, ['Cast off 6 at the right (carriage side)'], 'right', 84],
    [182, ['Decrease 1 each end'], 'left', 82],
    [227, ['Cast off the last 24 stitches at the right (carriage side)'], 'right', 0],
  ])('row index %i: %j, carriage at the %s, %i in work', (i, now, carriage, inWork) => {
    const s = at(i)
    expect(texts(s)).toEqual(now)
    expect([s.carriageBefore, s.needlesInWork, s.part]).toEqual([carriage, inWork, null])
  })

  it('partSummary: one whole part', () => {
    const { shape } = stepper(sleeveSpec)
    expect(partSummary(shape)).toEqual([{ kind: 'whole', side: null, label: 'Whole piece', firstRow: 0, lastRow: 227, rows: 228, fabricFrom: 0, fabricTo: 227 }])
  })
})

describe('shapeStep — straight tops and a back (common practice)', () => {
  it('a rectangle keeps its stitches: after the last row, take them off or cast them off', () => {
    const { at, shape } = stepper({ kind: 'body', hemWidth: 40, lengthToUnderarm: 30 })
    const last = at(shape.rows.length - 1)
    expect(texts(last)).toEqual([])
    expect(texts(last, 'next')).toEqual(['Take the 120 stitches off on waste yarn, or cast them off'])
    expect(last.last).toBe(true)
    expect(at(shape.rows.length)).toMatchObject({ finished: true, needlesInWork: 120, next: [] })
    expect(texts(at(shape.rows.length))).toEqual(texts(last, 'next'))
  })

  it('a back: shoulder steps at the carriage side, the last one with the back neck', () => {
    const { at } = stepper({ ...frontSpec, neck: undefined })
    // Engine (knit side): row 216 cast off 12 at the left, … row 223 12 at the right and 48 at the centre.
    expect(texts(at(216))).toEqual(['Cast off 12 at the right (carriage side)'])
    expect(texts(at(223))).toEqual(['Cast off the last 60 stitches at the left (carriage side), the back neck included'])
  })

  it('a back with holding-position shoulders tells how to set the carriage on the first short row only', () => {
    const { at, shape } = stepper({ ...frontSpec, neck: undefined, shoulder: { width: 16, drop: 1.5, method: 'hold' } })
    const holds = shape.rows.map((_, i) => at(i)).filter(s => s.now.some(x => x.kind === 'hold'))
    expect(holds.length).toBeGreaterThan(1)
    expect(holds[0]!.now[0]!.note).toMatch(/^Set the carriage/)
    expect(holds.slice(1).every(s => s.now.every(x => x.note === undefined))).toBe(true)
  })

  it('refuses a row that is not in the piece', () => {
    const { shape, needles } = stepper(sleeveSpec)
    for (const i of [-1, 229, 1.5, Number.NaN]) expect(() => shapeStep(shape, needles, i)).toThrow(RangeError)
    expect(() => shapeStep(shape, needles.slice(1), 0)).toThrow(RangeError)
  })
})

describe('shapeStep — properties over generated pieces', () => {
  it('cast-offs at an edge only at the carriage side; next = the following row\'s now; needles in work from the bed; no hard counts', () => {
    let pieces = 0
    fc.assert(fc.property(specArb, gaugeArb, (spec, gauge) => {
      const piece = tryShape(spec, gauge)
      if (piece === null) return
      pieces++
      const shape = frozen(piece, spec.kind)
      const needles = shapedNeedles(piece)
      const steps = shape.rows.map((_, i) => shapeStep(shape, needles, i))
      const after = shapeStep(shape, needles, shape.rows.length)
      steps.forEach((s, i) => {
        for (const x of s.now) {
          if ((x.kind === 'cast-off' || x.kind === 'cast-off-all') && (x.side === 'left' || x.side === 'right')) {
            if (x.side !== s.carriageBefore) throw new Error(`row ${i}: "${x.text}" with the carriage at the ${s.carriageBefore}`)
            if (!x.text.includes('(carriage side)')) throw new Error(`row ${i}: "${x.text}" does not say carriage side`)
          }
          if (x.count < 0 || !Number.isInteger(x.count)) throw new Error(`row ${i}: count ${x.count}`)
        }
        const following = i + 1 < steps.length ? steps[i + 1]! : after
        if (JSON.stringify(s.next) !== JSON.stringify(following.now)) throw new Error(`row ${i}: next is not the following row's now`)
        if (s.needlesInWork !== needles[i]!.knitTo - needles[i]!.knitFrom) throw new Error(`row ${i}: needles in work`)
        if (s.held !== shape.rows[i]!.held) throw new Error(`row ${i}: held`)
        if (s.carriageBefore !== machineSide(shape.rows[i]!.carriage)) throw new Error(`row ${i}: carriage`)
        if (i > 0 && steps[i - 1]!.carriageAfter !== s.carriageBefore) throw new Error(`row ${i}: the carriage jumped`)
        // The counts come from the rows: a cast-off's number is the row's.
        const r = shape.rows[i]!
        const removed = s.now.filter(x => x.kind.startsWith('cast-off')).reduce((a, x) => a + x.count, 0)
        if (removed !== r.castOff.left + r.castOff.right + r.castOff.centre) throw new Error(`row ${i}: cast-off counts`)
        const part = partOfRow(partSummary(shape), i)!
        if (s.part === null ? part.kind !== 'whole' : s.part.kind !== part.kind || s.part.row !== i - part.firstRow + 1) throw new Error(`row ${i}: part`)
      })
    }), { numRuns: 150 })
    expect(pieces).toBeGreaterThan(40)
  })

  it('jumping to a row gives what walking there gives (a pure function of the index)', () => {
    fc.assert(fc.property(specArb, gaugeArb, fc.nat(), (spec, gauge, seed) => {
      const piece = tryShape(spec, gauge)
      if (piece === null) return
      const shape = frozen(piece, spec.kind)
      const needles = shapedNeedles(piece)
      const walked = shape.rows.map((_, i) => shapeStep(shape, needles, i))
      const i = seed % shape.rows.length
      // A fresh copy of the frozen shape, as another device would read it.
      const copy = JSON.parse(JSON.stringify(shape)) as TimelineShape
      expect(shapeStep(copy, needles, i)).toEqual(walked[i])
    }), { numRuns: 150 })
  })

  it('the neck parts: the second part brings back exactly the needles the first held, and joins the yarn where the carriage is', () => {
    fc.assert(fc.property(specArb, gaugeArb, (spec, gauge) => {
      const piece = tryShape(spec, gauge)
      if (piece === null) return
      const shape = frozen(piece, spec.kind)
      const needles = shapedNeedles(piece)
      const spans = partSummary(shape)
      if (spans.length < 3) return
      const split = shapeStep(shape, needles, spans[1]!.firstRow)
      const back = shapeStep(shape, needles, spans[2]!.firstRow)
      const heldThen = split.now.find(x => x.kind === 'hold')
      const returned = back.now.find(x => x.kind === 'return')!
      expect(returned.count).toBe(heldThen?.count ?? 0)
      expect(returned.side).toBe(heldThen?.side ?? returned.side)
      expect(back.now.find(x => x.kind === 'join')!.side).toBe(back.carriageBefore)
    }), { numRuns: 150 })
  })
})
