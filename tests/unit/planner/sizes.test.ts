import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { gaugePer10cm, KnittingInputError, shapePiece } from '#shared/engine'
import {
  fillByStep, gradingProblems, measurementLabel, parseSizeList, remapShapeSizes, shapeNeeds, sizedShapeSpec, sizeFigures, sizeMapByName,
} from '#shared/planner/sizes'
import { shapeMeasurements, type PieceShape } from '#shared/types/plan'

// A plan's sizes (model declared in shared/planner/sizes.ts): one size's spec, grading helpers, figures.
const sizes4 = ['S', 'M', 'L', 'XL']
const body = (overrides: Partial<PieceShape> = {}): PieceShape => ({
  kind: 'body', carriageStart: 'right', armhole: false, shoulder: null, neck: null, cap: false,
  measurements: { hemWidth: [43, 48, 53, 58], lengthToUnderarm: [38, 40, 42, 44] }, ease: {}, ...overrides,
})
// A graded front by hand: chest 86/96/106/116 cm round the body is 43/48/53/58 flat.
const front = body({
  armhole: true, shoulder: 'cast-off', neck: 'round',
  measurements: {
    hemWidth: [43, 48, 53, 58], width: [43, 48, 53, 58], lengthToUnderarm: [38, 40, 42, 44],
    armholeCastOff: [2, 2, 3, 3], armholeDecrease: [1, 1.5, 2, 2.5], armholeDepth: [18, 19, 20, 21],
    shoulderWidth: [11, 12, 13, 14], shoulderDrop: [1.5, 1.5, 1.5, 1.5], neckWidth: [15, 16, 17, 18], neckDepth: [7, 7, 8, 8],
  },
  ease: { width: 2.5, hemWidth: 2.5 },
})

describe('shapeNeeds', () => {
  it.each([
    ['a plain body', body(), ['hemWidth', 'lengthToUnderarm']],
    ['a body with armhole, shoulders and neck', front, [
      'hemWidth', 'lengthToUnderarm', 'armholeCastOff', 'armholeDecrease', 'armholeDepth', 'shoulderWidth', 'shoulderDrop', 'neckWidth', 'neckDepth',
    ]],
    ['a back with shoulders only', body({ shoulder: 'hold' }), ['hemWidth', 'lengthToUnderarm', 'shoulderWidth', 'shoulderDrop']],
    ['a straight sleeve', body({ kind: 'sleeve' }), ['hemWidth', 'lengthToUnderarm']],
    ['a set-in sleeve', body({ kind: 'sleeve', cap: true }), ['hemWidth', 'lengthToUnderarm', 'capCastOff', 'capHeight', 'capTopWidth']],
    ['a body whose cap was left on (not a body choice)', body({ cap: true }), ['hemWidth', 'lengthToUnderarm']],
  ])('%s', (_, shape, required) => {
    expect(shapeNeeds(shape)).toEqual({ required, optional: ['width'] })
  })

  it('labels every measurement in plain words, by kind where they differ', () => {
    expect(measurementLabel('width', 'body')).toBe('Width at the chest')
    expect(measurementLabel('width', 'sleeve')).toBe('Width at the upper arm')
    expect(measurementLabel('hemWidth', 'sleeve')).toBe('Width at the cuff')
    for (const m of shapeMeasurements) expect(measurementLabel(m, 'body')).toMatch(/^[A-Z][a-z :()]+$/)
  })
})

describe('sizedShapeSpec', () => {
  it('adds the ease per size: chest 86/96/106/116 round (43…58 flat) with 2.5 ease flat is 5 round (worked by hand)', () => {
    expect([0, 1, 2, 3].map(i => sizedShapeSpec(front, i, 'cm').width)).toEqual([45.5, 50.5, 55.5, 60.5])
    // The carriage at the knitter's right is at the left seen from the knit side (shared/engine/sides.ts).
    expect(sizedShapeSpec(front, 2, 'cm')).toEqual({
      kind: 'body', carriageStart: 'left', hemWidth: 55.5, width: 55.5, lengthToUnderarm: 42,
      armhole: { castOff: 3, decrease: 2, depth: 20 },
      shoulder: { width: 13, drop: 1.5, method: 'cast-off' },
      neck: { width: 17, depth: 8, shape: 'round' },
    })
  })

  it('turns inches into cm after the ease: 20 in = 50.8 cm (NIST, exact), 18 in + 2 in ease likewise', () => {
    const inches = body({ measurements: { hemWidth: [20, 18], lengthToUnderarm: [15, 16] }, ease: { hemWidth: 0 } })
    expect(sizedShapeSpec(inches, 0, 'in').hemWidth).toBeCloseTo(50.8, 10)
    expect(sizedShapeSpec({ ...inches, ease: { hemWidth: 2 } }, 1, 'in').hemWidth).toBeCloseTo(50.8, 10)
    expect(sizedShapeSpec(inches, 1, 'in').lengthToUnderarm).toBeCloseTo(40.64, 10)
  })

  it('leaves the optional width out when its row is absent, and takes the cap of a sleeve', () => {
    const sleeve: PieceShape = {
      ...body({ kind: 'sleeve', cap: true }),
      measurements: { hemWidth: [20, 22], width: [32, 34], lengthToUnderarm: [45, 46], capCastOff: [2, 2], capHeight: [12, 13], capTopWidth: [8, 8] },
    }
    expect(sizedShapeSpec(sleeve, 1, 'cm')).toEqual({
      kind: 'sleeve', carriageStart: 'left', hemWidth: 22, width: 34, lengthToUnderarm: 46, cap: { castOff: 2, height: 13, topWidth: 8 },
    })
    expect('width' in sizedShapeSpec(body(), 0, 'cm')).toBe(false)
  })

  it('gives the engine a spec it can shape for every size', () => {
    const gauge = gaugePer10cm({ stitchesPer10cm: 30, rowsPer10cm: 40 })
    const castOns = [0, 1, 2, 3].map(i => shapePiece(sizedShapeSpec(front, i, 'cm'), gauge).castOn)
    expect(castOns).toEqual([137, 152, 167, 182]) // 45.5 cm × 3 sts/cm = 136.5, a half up (common practice)
  })

  it.each([
    ['a size with no value', body({ measurements: { hemWidth: [43, 48], lengthToUnderarm: [38, 40] } }), 2, 'shape.measurements.hemWidth[2]', /Width at the hem has no number for size 3/],
    ['a required row absent', body({ neck: 'v', measurements: { ...body().measurements, neckDepth: [7, 7, 8, 8] } }), 0, 'shape.measurements.neckWidth[0]', /Neck width/],
    ['a value that is not a number', body({ measurements: { hemWidth: [43, Number.NaN, 53, 58], lengthToUnderarm: [38, 40, 42, 44] } }), 1, 'shape.measurements.hemWidth[1]', /no number/],
    ['a gap in the optional width', body({ measurements: { ...body().measurements, width: [50, 55] } }), 3, 'shape.measurements.width[3]', /Width at the chest/],
    ['ease that takes a width below 0', body({ ease: { hemWidth: -45 } }), 0, 'shape.measurements.hemWidth[0]', /comes to -2 cm for size 1; it must be more than 0/],
  ])('refuses %s, naming the entry', (_, shape, size, field, message) => {
    let caught: unknown
    try { sizedShapeSpec(shape, size, 'cm') }
    catch (e) { caught = e }
    expect(caught).toBeInstanceOf(KnittingInputError)
    expect((caught as KnittingInputError).field).toBe(field)
    expect((caught as Error).message).toMatch(message)
    expect((caught as Error).message.startsWith(field)).toBe(true)
  })

  it('lets a shoulder drop of 0 through (a straight shoulder) but not a size index that is not one', () => {
    const straight = body({ shoulder: 'cast-off', measurements: { ...body().measurements, shoulderWidth: [12, 13, 14, 15], shoulderDrop: [0, 0, 0, 0] } })
    expect(sizedShapeSpec(straight, 0, 'cm').shoulder).toEqual({ width: 12, drop: 0, method: 'cast-off' })
    expect(() => sizedShapeSpec(straight, -1, 'cm')).toThrow(KnittingInputError)
    expect(() => sizedShapeSpec(straight, 1.5, 'cm')).toThrow(/size/)
  })
})

describe('fillByStep', () => {
  it.each([
    ['chest 86 by 10', 86, 10, 4, [86, 96, 106, 116]],
    ['no float noise: 52 by 0.1', 52, 0.1, 4, [52, 52.1, 52.2, 52.3]],
    ['quarter inches stay quarter inches', 20, 0.25, 3, [20, 20.25, 20.5]],
    ['counting down', 10, -1.5, 3, [10, 8.5, 7]],
    ['one size', 43, 5, 1, [43]],
    ['no sizes', 43, 5, 0, []],
  ])('%s', (_, first, step, count, expected) => {
    expect(fillByStep(first, step, count)).toEqual(expected)
  })

  it('refuses a count that is not a whole number of sizes, and steps that are not numbers', () => {
    expect(() => fillByStep(1, 1, -1)).toThrow(KnittingInputError)
    expect(() => fillByStep(1, 1, 2.5)).toThrow(/count/)
    expect(() => fillByStep(1, Number.NaN, 2)).toThrow(/step/)
    expect(() => fillByStep(Number.POSITIVE_INFINITY, 1, 2)).toThrow(/first/)
  })
})

describe('gradingProblems', () => {
  it('finds nothing in a well-graded front, level small details included (common practice)', () => {
    expect(gradingProblems(front, sizes4)).toEqual([])
  })

  it('reports a drop, naming the two sizes and the values', () => {
    const shape = { ...front, measurements: { ...front.measurements, neckWidth: [15, 16, 15.5, 18] } }
    expect(gradingProblems(shape, sizes4)).toEqual([{ measurement: 'neckWidth', size: 2, message: 'Neck width gets smaller from M to L (16 → 15.5)' }])
  })

  it('lets lengths and details stay level, but not the chest or a body\'s hem (common practice: they make the size)', () => {
    const shape = body({ measurements: { hemWidth: [43, 43, 53, 58], width: [50, 55, 55, 60], lengthToUnderarm: [38, 38, 40, 40] } })
    expect(gradingProblems(shape, sizes4)).toEqual([
      { measurement: 'hemWidth', size: 1, message: 'Width at the hem is the same for S and M (43): it should grow with every size' },
      { measurement: 'width', size: 2, message: 'Width at the chest is the same for M and L (55): it should grow with every size' },
    ])
    // A sleeve's cuff often stays the same across sizes; its upper arm does not.
    const sleeve = body({ kind: 'sleeve', measurements: { hemWidth: [20, 20, 22, 22], width: [30, 32, 34, 34], lengthToUnderarm: [45, 45, 46, 46] } })
    expect(gradingProblems(sleeve, sizes4).map(p => [p.measurement, p.size])).toEqual([['width', 3]])
  })

  it('reports a row with more or fewer values than sizes, and skips gaps', () => {
    const shape = body({ measurements: { hemWidth: [43, 48, 53], lengthToUnderarm: [38, Number.NaN, 36, 44, 46] } })
    expect(gradingProblems(shape, sizes4)).toEqual([
      { measurement: 'hemWidth', size: 3, message: 'Width at the hem has 3 values for 4 sizes' },
      { measurement: 'lengthToUnderarm', size: 4, message: 'Length to the underarm has 5 values for 4 sizes' },
    ])
  })

  it('ignores rows the piece does not use', () => {
    expect(gradingProblems(body({ measurements: { ...body().measurements, capHeight: [9, 8, 7, 6] } }), sizes4)).toEqual([])
  })

  it('property: a row filled by a positive step has no problem; a negative step is caught at its first drop', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 12 }), fc.integer({ min: 200, max: 1000 }).map(n => n / 10), fc.integer({ min: 1, max: 50 }).map(n => n / 10), fc.boolean(),
      (count, first, step, down) => {
        const sizes = Array.from({ length: count }, (_, i) => `size ${i + 1}`)
        const row = fillByStep(first, down ? -step : step, count)
        const shape = body({ measurements: { hemWidth: row, width: row, lengthToUnderarm: row } })
        const problems = gradingProblems(shape, sizes)
        if (!down || count === 1) expect(problems).toEqual([])
        else {
          expect(problems).toHaveLength(3 * (count - 1))
          expect(problems[0]).toMatchObject({ measurement: 'hemWidth', size: 1 })
        }
      },
    ))
  })
})

describe('sizeFigures', () => {
  it.each([
    ['four sizes (common practice: first size, the others in brackets)', [150, 162, 174, 186], undefined, '150 (162, 174, 186)'],
    ['one size', [150], undefined, '150'],
    ['no sizes', [], undefined, ''],
    ['decimals without noise', [52.300000000000004, 20.25, 7], undefined, '52.3 (20.25, 7)'],
    ['text as it is', ['every 7th row ×4', 'every 6th row ×5'], 1, 'every 7th row ×4 (every 6th row ×5)'],
  ])('%s', (_, values, chosen, text) => {
    expect(sizeFigures(values, chosen).text).toBe(text)
  })

  it('marks the chosen size for a highlight', () => {
    expect(sizeFigures([150, 162, 174], 1).parts).toEqual([
      { value: '150', chosen: false }, { value: '162', chosen: true }, { value: '174', chosen: false },
    ])
    expect(sizeFigures([150, 162]).parts.every(p => !p.chosen)).toBe(true)
  })
})

describe('changing the sizes', () => {
  const shape = body({ measurements: { hemWidth: [43, 48, 53, 58], lengthToUnderarm: [38, 40, 42, 44] }, ease: { hemWidth: 2 } })

  it.each([
    ['a size added at the end continues the step', [0, 1, 2, 3, null], [43, 48, 53, 58, 63]],
    ['a size removed', [0, 2, 3], [43, 53, 58]],
    ['two sizes swapped', [1, 0, 2, 3], [48, 43, 53, 58]],
    ['a size added after one: the same number', [0, null], [43, 43]],
    ['a size added first: no number yet', [null, 0], [Number.NaN, 43]],
  ])('%s', (_, from, hem) => {
    const after = remapShapeSizes(shape, from)
    expect(after.measurements.hemWidth).toEqual(hem)
    expect(after.measurements.lengthToUnderarm).toHaveLength(from.length)
    expect(after.ease).toEqual({ hemWidth: 2 })
    expect(shape.measurements.hemWidth).toEqual([43, 48, 53, 58]) // the old shape is left as it was
  })

  it('maps a typed range by name, ignoring capitals, else by position', () => {
    expect(sizeMapByName(['S', 'M', 'L'], ['xs', 's', 'm', 'l', 'xl'])).toEqual([null, 0, 1, 2, null])
    expect(sizeMapByName(['S', 'M', 'L'], ['chest 86', 'chest 96'])).toEqual([0, 1])
    expect(sizeMapByName(['One size'], ['S', 'M', 'L'])).toEqual([0, null, null])
  })

  it('reads a typed list of sizes', () => {
    expect(parseSizeList(' XS, S,M ;L\nXL,, s ')).toEqual(['XS', 'S', 'M', 'L', 'XL'])
    expect(parseSizeList(' , ')).toEqual([])
  })
})
