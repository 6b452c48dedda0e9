// Shape specs for tests: the two hand-worked pieces of tests/unit/engine/shapePiece.test.ts
// (their sheets are written out there) and fast-check arbitraries of valid-looking specs.

import fc from 'fast-check'
import { KnittingInputError, shapePiece } from '#shared/engine'
import type { ShapedPiece, ShapeSpec } from '#shared/engine'

/** (a) Front, round neck, at 30 sts and 40 rows to 10 cm: 150 → 162 sts, 225 rows. */
export const frontSpec: ShapeSpec = {
  kind: 'body',
  carriageStart: 'left',
  hemWidth: 50,
  width: 54,
  lengthToUnderarm: 36,
  armhole: { castOff: 2, decrease: 1, depth: 20 },
  shoulder: { width: 16, drop: 1.5, method: 'cast-off' },
  neck: { width: 16, depth: 8, shape: 'round' },
}

/** (b) Set-in sleeve at the same gauge: 60 → 96 sts, cap to 24. */
export const sleeveSpec: ShapeSpec = {
  kind: 'sleeve',
  hemWidth: 20,
  width: 32,
  lengthToUnderarm: 45,
  cap: { castOff: 2, height: 12, topWidth: 8 },
}

export const gaugeArb = fc.record({
  stitchesPer10cm: fc.integer({ min: 150, max: 450 }).map(n => n / 10),
  rowsPer10cm: fc.integer({ min: 200, max: 600 }).map(n => n / 10),
})
export const cm = (min: number, max: number) => fc.integer({ min: min * 4, max: max * 4 }).map(n => n / 4)

export const bodyArb: fc.Arbitrary<ShapeSpec> = fc
  .record({
    kind: fc.constant('body' as const),
    carriageStart: fc.option(fc.constantFrom('left' as const, 'right' as const), { nil: undefined }),
    hemWidth: cm(30, 65),
    widen: fc.option(cm(-4, 8), { nil: undefined }),
    lengthToUnderarm: cm(15, 50),
    armhole: fc.option(fc.record({ castOff: cm(0, 4), decrease: cm(0, 3), depth: cm(14, 26) }), { nil: undefined }),
    shoulder: fc.option(fc.record({ width: cm(6, 15), drop: cm(0, 3), method: fc.constantFrom('cast-off' as const, 'hold' as const) }), { nil: undefined }),
    neck: fc.option(fc.record({ width: cm(8, 18), depth: cm(2, 12), shape: fc.constantFrom('round' as const, 'v' as const, 'square' as const) }), {
      nil: undefined,
    }),
  })
  .map(({ widen, ...s }) => ({ ...s, width: widen === undefined ? undefined : s.hemWidth + widen }))

export const sleeveArb: fc.Arbitrary<ShapeSpec> = fc.record({
  kind: fc.constant('sleeve' as const),
  carriageStart: fc.option(fc.constantFrom('left' as const, 'right' as const), { nil: undefined }),
  hemWidth: cm(14, 30),
  widen: fc.option(cm(0, 16), { nil: undefined }),
  lengthToUnderarm: cm(10, 50),
  cap: fc.option(fc.record({ castOff: cm(0, 3), height: cm(4, 16), topWidth: cm(3, 12) }), { nil: undefined }),
}).map(({ widen, ...s }) => ({ ...s, width: widen === undefined ? undefined : s.hemWidth + widen }))

export const specArb = fc.oneof(bodyArb, sleeveArb)

/** Shape, or null when the spec is refused (the refusal must be a KnittingInputError). */
export function tryShape(spec: ShapeSpec, gauge: { stitchesPer10cm: number; rowsPer10cm: number }): ShapedPiece | null {
  try { return shapePiece(spec, gauge) }
  catch (e) {
    if (e instanceof KnittingInputError) return null
    throw e
  }
}
