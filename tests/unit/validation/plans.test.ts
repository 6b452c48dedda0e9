import { describe, expect, it } from 'vitest'
import { planBody, planPatch, planPieceSchema, planSizes, shapeSizeIssues } from '#shared/validation/plans'
import { shapeMeasurements } from '#shared/types/plan'

// The plan schemas' sizes and shapes (the rest of the plan body is covered by the integration tests).
const issuesOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (result.error?.issues ?? []).map(i => `${i.path.join('.')}: ${i.message}`)

const sections = [{ kind: 'plain', rows: 4, yarn: 'A' }]
const frontShape = (n: number) => ({
  kind: 'body', armhole: true, shoulder: 'cast-off', neck: 'round',
  measurements: {
    hemWidth: Array(n).fill(48), width: Array(n).fill(50), lengthToUnderarm: Array(n).fill(40),
    armholeCastOff: Array(n).fill(2), armholeDecrease: Array(n).fill(0), armholeDepth: Array(n).fill(19),
    shoulderWidth: Array(n).fill(12), shoulderDrop: Array(n).fill(0), neckWidth: Array(n).fill(16), neckDepth: Array(n).fill(7),
  },
  ease: { width: 2.5 },
})
const piece = (shape: unknown) => ({ name: 'Front', targetWidth: 50, targetLength: 60, sections, shape })
const plan = (fields: Record<string, unknown>) => ({ studioId: 1, name: 'Yoke', pieces: [piece(null)], ...fields })

describe('plan sizes', () => {
  it('defaults to one size at create, and keeps a patch without sizes without them', () => {
    expect(planBody.parse(plan({})).sizes).toEqual(['One size'])
    expect(planBody.parse(plan({})).sizes).not.toBe(planBody.parse(plan({})).sizes)
    expect('sizes' in planPatch.parse({ name: 'Yoke' })).toBe(false)
  })

  it('trims the names', () => {
    expect(planSizes.parse([' XS ', 'S', 'chest 86'])).toEqual(['XS', 'S', 'chest 86'])
  })

  it.each([
    ['no size', [], [': at least one size']],
    ['thirteen sizes', Array.from({ length: 13 }, (_, i) => `${i}`), [': at most 12 sizes']],
    ['an empty name', ['S', '  '], ['1: is required']],
    ['a long name', ['x'.repeat(21)], ['0: must be at most 20 characters']],
    ['the same name twice, ignoring capitals', ['S', 'M', 'm'], ['2: "m" is already size 2 ("M"): each size needs its own name']],
    ['not text', ['S', 3], ['1: must be text']],
  ])('refuses %s', (_, sizes, messages) => {
    expect(issuesOf(planSizes.safeParse(sizes))).toEqual(messages)
  })
})

describe('piece shape', () => {
  it('takes a rectangle (no shape, or null) as before', () => {
    expect(planPieceSchema.parse(piece(null)).shape).toBeNull()
    expect(planPieceSchema.parse({ name: 'Back', targetWidth: 50, targetLength: 60, sections }).shape).toBeUndefined()
  })

  it('takes a shaped front and fills in the choices left out', () => {
    const parsed = planPieceSchema.parse(piece({ kind: 'sleeve', measurements: { hemWidth: [20], lengthToUnderarm: [45] } })).shape
    expect(parsed).toEqual({
      kind: 'sleeve', carriageStart: 'right', armhole: false, shoulder: null, neck: null, cap: false,
      measurements: { hemWidth: [20], lengthToUnderarm: [45] }, ease: {},
    })
    expect(planPieceSchema.safeParse(piece(frontShape(4))).success).toBe(true)
  })

  it.each([
    ['a sleeve with body choices', { kind: 'sleeve', armhole: true, shoulder: 'hold', neck: 'v', measurements: { hemWidth: [20], lengthToUnderarm: [45] } }, [
      'shape.armhole: a sleeve has no armhole (give it a cap for a set-in sleeve)',
      'shape.shoulder: a sleeve has no shoulders',
      'shape.neck: a sleeve has no neckline',
    ]],
    ['a body with a cap', { kind: 'body', cap: true, measurements: { hemWidth: [48], lengthToUnderarm: [40] } }, [
      'shape.cap: a body has no cap (the cap is the top of a sleeve)',
    ]],
    ['a neck without its measurements', { kind: 'body', neck: 'square', measurements: { hemWidth: [48], lengthToUnderarm: [40], neckDepth: [6] } }, [
      'shape.measurements.neckWidth: is needed for a neckline',
    ]],
    ['a measurement the choices do not use', { kind: 'sleeve', measurements: { hemWidth: [20], lengthToUnderarm: [45], capHeight: [12] }, ease: { capHeight: 1 } }, [
      'shape.measurements.capHeight: is not used by a piece without a sleeve cap',
      'shape.ease.capHeight: is not used by a piece without a sleeve cap',
    ]],
    ['values out of range', { kind: 'body', shoulder: 'hold', measurements: { hemWidth: [0, 501], lengthToUnderarm: [40, -1], shoulderWidth: [12, 12], shoulderDrop: [0, 0] } }, [
      'shape.measurements.hemWidth.0: must be more than 0',
      'shape.measurements.hemWidth.1: must be at most 500',
      'shape.measurements.lengthToUnderarm.1: must be more than 0',
    ]],
    ['a value that is not a number', { kind: 'body', measurements: { hemWidth: [48, null], lengthToUnderarm: [40, 42] } }, ['shape.measurements.hemWidth.1: must be a number']],
    ['ease past 50', { kind: 'body', measurements: { hemWidth: [48], lengthToUnderarm: [40] }, ease: { hemWidth: -51 } }, ['shape.ease.hemWidth: must be at least -50']],
    ['an unknown kind', { kind: 'yoke', measurements: {} }, ['shape.kind: must be "body" or "sleeve"']],
    ['an empty row', { kind: 'body', measurements: { hemWidth: [], lengthToUnderarm: [40] } }, ['shape.measurements.hemWidth: needs a number for each size']],
  ])('refuses %s', (_, shape, messages) => {
    expect(issuesOf(planPieceSchema.safeParse(piece(shape)))).toEqual(messages)
  })

  it('lets the cast-offs, decreases and drops be 0, and only those', () => {
    const zeroable = ['shoulderDrop', 'armholeCastOff', 'armholeDecrease', 'capCastOff']
    for (const key of shapeMeasurements) {
      const kind = key.startsWith('cap') ? 'sleeve' : 'body'
      const shape = kind === 'sleeve' ? { kind, cap: true, measurements: {} as Record<string, number[]> } : { ...frontShape(1), measurements: { ...frontShape(1).measurements } as Record<string, number[]> }
      for (const k of ['hemWidth', 'lengthToUnderarm', ...(kind === 'sleeve' ? ['capCastOff', 'capHeight', 'capTopWidth'] : [])]) shape.measurements[k] ??= [10]
      shape.measurements[key] = [0]
      expect(planPieceSchema.safeParse(piece(shape)).success, key).toBe(zeroable.includes(key))
    }
  })
})

describe('sizes against shapes', () => {
  it('needs a number per size in every row when the body carries both', () => {
    expect(planBody.safeParse(plan({ sizes: ['S', 'M', 'L'], pieces: [piece(null), piece(frontShape(3))] })).success).toBe(true)
    const wrong = { ...frontShape(3), measurements: { ...frontShape(3).measurements, neckWidth: [15, 16] } }
    expect(issuesOf(planPatch.safeParse({ sizes: ['S', 'M', 'L'], pieces: [piece(null), piece(wrong)] }))).toEqual([
      'pieces.1.shape.measurements.neckWidth: has 2 numbers but the plan has 3 sizes (S, M, L)',
    ])
  })

  it('checks a created plan without sizes against its one size', () => {
    expect(issuesOf(planBody.safeParse(plan({ pieces: [piece(frontShape(2))] })))[0]).toBe(
      'pieces.0.shape.measurements.hemWidth: has 2 numbers but the plan has 1 size (One size)',
    )
  })

  it('leaves a patch with only one of the two to the route (shapeSizeIssues against the stored plan)', () => {
    expect(planPatch.safeParse({ pieces: [piece(frontShape(2))] }).success).toBe(true)
    expect(shapeSizeIssues([{ shape: null }, { shape: frontShape(2) }], ['S', 'M', 'L']).map(i => i.path.join('.'))).toEqual(
      Object.keys(frontShape(2).measurements).map(k => `pieces.1.shape.measurements.${k}`),
    )
  })
})
