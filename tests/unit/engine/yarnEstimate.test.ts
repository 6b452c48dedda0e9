import { describe, expect, it } from 'vitest'
import { chartFromRows, estimateYarn } from '#shared/engine'
import type { YarnEstimateInput } from '#shared/engine'
import { inputError } from './helpers'

describe('estimateYarn', () => {
  it('swatch of 10,000 stitches weighing 70 g, piece of 130,800 stitches → 915.6 g (knitting handbooks via REFERENCES.md — published)', () => {
    // 200 needles × 654 rows = 130,800 stitches, plain, so no floats.
    const out = estimateYarn({
      plan: { technique: 'together', sections: [{ kind: 'plain', rows: 654, yarn: 'grey' }] },
      placement: { needles: 200 },
      swatch: { stitches: 10000, grams: 70 },
      needlePitchMm: 4.5,
      yarns: { grey: { metresPer100g: 400 } },
    })
    expect(out.yarns).toHaveLength(1)
    const grey = out.yarns[0]!
    expect(grey.stitches).toBe(130800)
    expect(grey.floatMm).toBe(0)
    expect(grey.grams).toBeCloseTo(915.6, 9)
    expect(grey.metres).toBeCloseTo(915.6 * 4, 9)
  })

  // Hand-worked (declared model, common practice: one needle pitch of yarn per stitch floated past).
  // Chart "x..." on 8 needles: each row has 2 contrast and 6 main stitches.
  // 3 chart rows together → main knits 18, floats 6; contrast knits 6, floats 18.
  // Swatch 1000 stitches = 10 g → 0.01 g a stitch; pitch 5 mm; both yarns 500 m per 100 g = 5 m/g.
  const base: YarnEstimateInput = {
    plan: {
      technique: 'together',
      sections: [
        { kind: 'plain', rows: 2, yarn: 'M' },
        { kind: 'motif', chart: chartFromRows(['x...']), chartRows: 3, main: 'M', contrast: 'C' },
      ],
    },
    placement: { needles: 8 },
    swatch: { stitches: 1000, grams: 10 },
    needlePitchMm: 5,
    yarns: { M: { metresPer100g: 500 }, C: { metresPer100g: 500 } },
  }

  it('adds one needle pitch per stitch floated past (together, hand-worked)', () => {
    const [m, c] = estimateYarn(base).yarns
    // M: plain 16 + motif 18 stitches = 34 → 0.34 g; floats 6 × 5 mm = 30 mm = 0.03 m → 0.006 g
    expect(m).toMatchObject({ yarn: 'M', stitches: 34, floatStitches: 6, floatMm: 30 })
    expect(m!.grams).toBeCloseTo(0.346, 12)
    expect(m!.metres).toBeCloseTo(1.73, 12)
    // C: 6 stitches → 0.06 g; floats 18 × 5 = 90 mm → 0.018 g
    expect(c).toMatchObject({ yarn: 'C', stitches: 6, floatStitches: 18, floatMm: 90 })
    expect(c!.grams).toBeCloseTo(0.078, 12)
  })

  it('colour-by-colour doubles stitches and floats for two passes per colour', () => {
    const out = estimateYarn({ ...base, plan: { ...base.plan, technique: 'colour-by-colour' } })
    const [m, c] = out.yarns
    expect(m).toMatchObject({ stitches: 16 + 36, floatStitches: 12 })
    expect(c).toMatchObject({ stitches: 12, floatStitches: 36 })
    expect(out.model).toMatch(/2 passes each per chart row/)
  })

  it('honours the offset and partial chart repeats', () => {
    // rows "x..." and "...." over 4 needles, 3 chart rows → rows 0, 1, 0 → 2 contrast stitches; row 1 leaves C unused
    const out = estimateYarn({
      ...base,
      plan: { technique: 'together', sections: [{ kind: 'motif', chart: chartFromRows(['x...', '....']), chartRows: 3, main: 'M', contrast: 'C' }] },
      placement: { needles: 4, offset: 3 },
    })
    expect(out.yarns.map(y => [y.yarn, y.stitches, y.floatStitches])).toEqual([['M', 10, 2], ['C', 2, 10]])
  })

  it('describes its model', () => {
    expect(estimateYarn(base).model).toMatch(/one needle pitch \(5 mm\)/)
  })

  it.each([
    [{ yarns: { M: { metresPer100g: 500 } } }, 'yarns: no metres per 100 g given for yarn "C"'],
    [{ yarns: { M: { metresPer100g: 500 }, C: { metresPer100g: 0 } } }, 'yarns.C.metresPer100g: must be greater than 0, got 0'],
    [{ swatch: { stitches: 1000, grams: -1 } }, 'swatch.grams: must be greater than 0, got -1'],
    [{ needlePitchMm: 0 }, 'needlePitchMm: must be greater than 0, got 0'],
    [{ placement: { needles: 0 } }, 'placement.needles: must be at least 1, got 0'],
  ])('rejects %o', (patch, message) => {
    expect(inputError(() => estimateYarn({ ...base, ...patch } as YarnEstimateInput)).message).toBe(message)
  })
})
