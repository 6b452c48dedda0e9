import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { unit } from 'mathjs'
import {
  cmToIn, gaugeFromPer4in, gaugeFromPerInch, gaugeFromSwatch, gaugePer10cm, gaugePer4in, gaugePerInch,
  gramsToOunces, inToCm, metresPer100gToYardsPer100g, metresPer100gToYardsPerOunce, metresToYards,
  ouncesToGrams, per10cmToPer4in, per4inToPer10cm, roundHalfUp, roundToRepeat, rowsForLength,
  stitchesForWidth, yardsPer100gToMetresPer100g, yardsPerOunceToMetresPer100g, yardsToMetres,
} from '#shared/engine'
import { inputError } from './helpers'

describe('gauge — handbook worked examples', () => {
  it('18 sts and 24 rows to 4 in → 4.5 sts and 6 rows per inch (knitting handbooks via REFERENCES.md — published)', () => {
    const g = gaugeFromSwatch({ stitches: 18, rows: 24, widthCm: inToCm(4), heightCm: inToCm(4) })
    const perInch = gaugePerInch(g)
    expect(perInch.stitchesPerInch).toBeCloseTo(4.5, 12)
    expect(perInch.rowsPerInch).toBeCloseTo(6, 12)
    const per4 = gaugePer4in(g)
    expect(per4.stitchesPer4in).toBeCloseTo(18, 12)
    expect(per4.rowsPer4in).toBeCloseTo(24, 12)
  })

  it('9 in at 5.5 sts/in → 49.5 → 50 sts, rounding to nearest (handbooks via REFERENCES.md — published; half up is our rule)', () => {
    expect(stitchesForWidth(inToCm(9), gaugeFromPerInch({ stitchesPerInch: 5.5, rowsPerInch: 7 }))).toBe(50)
  })

  it('49 cm at 40 rows per 10 cm → 196 rows (handbooks via REFERENCES.md — published)', () => {
    expect(rowsForLength(49, gaugePer10cm({ stitchesPer10cm: 28, rowsPer10cm: 40 }))).toBe(196)
  })

  // Same arithmetic, our own rows (common practice: count = size × gauge, rounded to nearest, half up).
  it.each([
    // swatch sts, rows, widthCm, heightCm, target width cm → sts, target length cm → rows
    [30, 40, 10, 10, 50, 150, 60, 240], // 3 sts/cm: 50 cm → 150
    [28, 36, 10, 10, 45, 126, 55, 198],
    [32, 44, 12.5, 12.5, 40, 102, 30, 106], // 2.56 sts/cm × 40 = 102.4 → 102; 3.52 × 30 = 105.6 → 106
    [20, 30, 8, 8, 1, 3, 2, 8], // 2.5 sts/cm → 2.5 → 3 (half up); 3.75 rows/cm × 2 = 7.5 → 8
    [21, 29, 10, 10, 0, 0, 0, 0],
  ])('swatch %i sts × %i rows over %s × %s cm: %s cm → %i sts, %s cm → %i rows (common practice)',
    (sts, rows, w, h, widthCm, wantSts, lengthCm, wantRows) => {
      const g = gaugeFromSwatch({ stitches: sts, rows, widthCm: w, heightCm: h })
      expect(stitchesForWidth(widthCm, g)).toBe(wantSts)
      expect(rowsForLength(lengthCm, g)).toBe(wantRows)
    })

  it('gives stitch width and row height in mm', () => {
    const g = gaugeFromSwatch({ stitches: 30, rows: 40, widthCm: 10, heightCm: 10 })
    expect(g.stitchesPer10cm).toBe(30)
    expect(g.rowsPer10cm).toBe(40)
    expect(g.stitchWidthMm).toBeCloseTo(100 / 30, 12)
    expect(g.rowHeightMm).toBe(2.5)
  })

  it('per 4 in and per 10 cm differ by 1.6 % (NIST SP 811 B.8: 4 in = 10.16 cm — published)', () => {
    const g = gaugeFromPer4in({ stitchesPer4in: 22, rowsPer4in: 30 })
    expect(g.stitchesPer10cm).toBeCloseTo(22 / 1.016, 12)
    expect(per10cmToPer4in(22)).toBeCloseTo(22.352, 12)
    expect(per4inToPer10cm(per10cmToPer4in(27))).toBeCloseTo(27, 12)
  })

  it('round trips per-inch and per-4-in views (property)', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 80, noNaN: true }), fc.double({ min: 1, max: 80, noNaN: true }), (s, r) => {
      const g = gaugeFromPer4in({ stitchesPer4in: s, rowsPer4in: r })
      expect(gaugePer4in(g).stitchesPer4in).toBeCloseTo(s, 9)
      expect(gaugePer4in(g).rowsPer4in).toBeCloseTo(r, 9)
      expect(gaugePerInch(g).stitchesPerInch * 4).toBeCloseTo(s, 9)
    }))
  })

  it.each([
    [{ stitches: 0, rows: 10, widthCm: 10, heightCm: 10 }, 'swatch.stitches: must be at least 1, got 0'],
    [{ stitches: 10.5, rows: 10, widthCm: 10, heightCm: 10 }, 'swatch.stitches: expected a whole number, got 10.5'],
    [{ stitches: 10, rows: 10, widthCm: 0, heightCm: 10 }, 'swatch.widthCm: must be greater than 0, got 0'],
    [{ stitches: 10, rows: 10, widthCm: 10, heightCm: Number.POSITIVE_INFINITY }, 'swatch.heightCm: expected a number, got Infinity'],
  ])('rejects swatch %o', (swatch, message) => {
    expect(inputError(() => gaugeFromSwatch(swatch)).message).toBe(message)
  })

  it('rejects a negative width', () => {
    const g = gaugePer10cm({ stitchesPer10cm: 28, rowsPer10cm: 40 })
    expect(inputError(() => stitchesForWidth(-1, g)).message).toBe('widthCm: must not be negative, got -1')
  })
})

describe('rounding rules (declared)', () => {
  it.each([[49.5, 50], [49.49, 49], [0.5, 1], [2.4999999999999996, 3], [7, 7]])('roundHalfUp(%s) = %i', (x, want) => {
    expect(roundHalfUp(x)).toBe(want)
  })
  it.each([
    [100, 24, 'nearest', 96], [108, 24, 'nearest', 120], [100, 24, 'up', 120], [100, 24, 'down', 96],
    [5, 24, 'down', 24], [120, 24, 'up', 120],
  ] as const)('roundToRepeat(%i, %i, %s) = %i', (st, rep, mode, want) => {
    expect(roundToRepeat(st, rep, mode)).toBe(want)
  })
})

describe('units — NIST SP 811 Appendix B.8 exact definitions (published), mathjs as independent oracle', () => {
  it.each([
    ['in → cm', inToCm(1), 2.54, unit(1, 'inch').toNumber('cm')],
    ['cm → in', cmToIn(10.16), 4, unit(10.16, 'cm').toNumber('inch')],
    ['yd → m', yardsToMetres(1), 0.9144, unit(1, 'yard').toNumber('m')],
    ['m → yd', metresToYards(201.168), 220, unit(201.168, 'm').toNumber('yard')],
    ['oz → g', ouncesToGrams(1), 28.349523125, unit(1, 'ounce').toNumber('g')],
    ['g → oz', gramsToOunces(100), 100 / 28.349523125, unit(100, 'g').toNumber('ounce')],
  ])('%s', (_name, ours, exact, oracle) => {
    expect(ours).toBeCloseTo(exact, 12)
    expect(ours).toBeCloseTo(oracle, 12)
  })

  it('220 yd per 100 g = 201.168 m per 100 g (REFERENCES.md — published)', () => {
    expect(yardsPer100gToMetresPer100g(220)).toBeCloseTo(201.168, 12)
    expect(metresPer100gToYardsPer100g(201.168)).toBeCloseTo(220, 12)
  })

  it('m per 100 g ↔ yd per oz agrees with mathjs (property)', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 2000, noNaN: true }), (m) => {
      const oracle = unit(m, 'm').toNumber('yard') / unit(100, 'g').toNumber('ounce')
      expect(metresPer100gToYardsPerOunce(m)).toBeCloseTo(oracle, 9)
      expect(yardsPerOunceToMetresPer100g(metresPer100gToYardsPerOunce(m))).toBeCloseTo(m, 9)
    }))
  })

  it('cm ↔ in agrees with mathjs (property)', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), (cm) => {
      expect(cmToIn(cm)).toBeCloseTo(unit(cm, 'cm').toNumber('inch'), 9)
    }))
  })
})
