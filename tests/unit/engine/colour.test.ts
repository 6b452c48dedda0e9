import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { converter, differenceCiede2000, wcagContrast, wcagLuminance } from 'culori'
// @ts-expect-error color-diff ships no type declarations
import { diff as colorDiffCiede2000 } from 'color-diff'
import {
  contrastRatio, deltaE2000, distinguishable, DISTINGUISHABLE_RULE, hexToLab,
  normaliseHexColour, parseHexColour, relativeLuminance, type Lab,
} from '#shared/engine/colour'
import { KnittingInputError } from '#shared/engine/errors'

// Independent oracles. culori's `lab` mode is D50; `lab65` is the D65 one we declare.
const toLab65 = converter('lab65')
const culoriDeltaE = differenceCiede2000()
const culoriLab = (lab: Lab) => ({ mode: 'lab65' as const, l: lab.L, a: lab.a, b: lab.b })
const colorDiff = (x: Lab, y: Lab): number => colorDiffCiede2000(x, y)

const hexArb = fc.tuple(
  fc.integer({ min: 0, max: 255 }), fc.integer({ min: 0, max: 255 }), fc.integer({ min: 0, max: 255 }),
).map(cs => '#' + cs.map(c => c.toString(16).padStart(2, '0')).join(''))

describe('parseHexColour', () => {
  it.each([
    // [input, r, g, b, source]
    ['#1a2b3c', 26, 43, 60, 'CSS Color 4 hex notation (published)'],
    ['#1A2B3C', 26, 43, 60, 'hex digits are case-insensitive (CSS Color 4, published)'],
    ['#abc', 0xaa, 0xbb, 0xcc, '#rgb doubles each digit (CSS Color 4, published)'],
    ['#000', 0, 0, 0, 'CSS Color 4 (published)'],
    ['#ffffff', 255, 255, 255, 'CSS Color 4 (published)'],
  ])('%s → rgb(%i, %i, %i) — %s', (hex, r, g, b) => {
    expect(parseHexColour(hex)).toEqual({ r, g, b })
  })

  it('normalises to lower-case #rrggbb', () => {
    expect(normaliseHexColour('#ABC')).toBe('#aabbcc')
    expect(normaliseHexColour('#1A2b3C')).toBe('#1a2b3c')
  })

  it.each(['12345', '#12345', '#1a2b3g', '1a2b3c', '#1a2b3c4d', '', ' #abc', 'red'])(
    'rejects %j, naming the field and the value', (bad) => {
      expect(() => parseHexColour(bad)).toThrowError(KnittingInputError)
      expect(() => parseHexColour(bad)).toThrowError(
        `colour ${JSON.stringify(bad)}: expected a hex colour like #1a2b3c`,
      )
      try {
        parseHexColour(bad, 'yarn colour')
      }
      catch (error) {
        expect((error as KnittingInputError).field).toBe('yarn colour')
      }
    })

  it('rejects non-strings', () => {
    expect(() => parseHexColour(0x123456 as unknown as string)).toThrowError(KnittingInputError)
  })
})

describe('WCAG 2.x relative luminance and contrast ratio', () => {
  it.each([
    // [foreground, background, ratio, digits compared, source]
    ['#000000', '#ffffff', 21, 10, 'published, W3C WCAG 2.x (black/white 21:1)'],
    ['#777777', '#ffffff', 4.478, 3, 'published, W3C WCAG 2.x (#777 on white fails 4.5:1)'],
    ['#767676', '#ffffff', 4.542, 3, 'published, W3C WCAG 2.x (#767676 on white passes 4.5:1)'],
    ['#ffffff', '#ffffff', 1, 10, 'published, W3C WCAG 2.x (same colour 1:1)'],
    ['#ff0000', '#ffffff', 3.998, 3, 'computed from the WCAG formula (1.05 / 0.2626); culori agrees'],
    ['#0000ff', '#ffffff', 8.592, 3, 'computed from the WCAG formula (1.05 / 0.1222); culori agrees'],
    ['#00ff00', '#000000', 15.304, 3, 'computed from the WCAG formula (0.7652 / 0.05); culori agrees'],
    ['#808080', '#ffffff', 3.949, 3, 'computed from the WCAG formula; culori agrees'],
  ])('%s on %s → %f — %s', (fg, bg, ratio, digits) => {
    expect(contrastRatio(fg, bg)).toBeCloseTo(ratio, digits)
    expect(contrastRatio(bg, fg)).toBe(contrastRatio(fg, bg))
    expect(contrastRatio(fg, bg)).toBeCloseTo(wcagContrast(fg, bg), 10)
  })

  it('#777777 fails and #767676 passes the 4.5:1 line against white (published, W3C)', () => {
    expect(contrastRatio('#777777', '#fff')).toBeLessThan(4.5)
    expect(contrastRatio('#767676', '#fff')).toBeGreaterThanOrEqual(4.5)
  })

  it.each([
    ['#ffffff', 1, 'published, W3C WCAG 2.x'],
    ['#000000', 0, 'published, W3C WCAG 2.x'],
    ['#ff0000', 0.2126, 'published, W3C WCAG 2.x coefficient for R'],
    ['#00ff00', 0.7152, 'published, W3C WCAG 2.x coefficient for G'],
    ['#0000ff', 0.0722, 'published, W3C WCAG 2.x coefficient for B'],
  ])('relative luminance of %s is %f — %s', (hex, luminance) => {
    expect(relativeLuminance(hex)).toBeCloseTo(luminance, 12)
  })

  it('agrees with culori on random colours (independent oracle)', () => {
    fc.assert(fc.property(hexArb, hexArb, (a, b) => {
      expect(relativeLuminance(a)).toBeCloseTo(wcagLuminance(a), 12)
      const ratio = contrastRatio(a, b)
      expect(ratio).toBeCloseTo(wcagContrast(a, b), 10)
      expect(ratio).toBeGreaterThanOrEqual(1)
      expect(ratio).toBeLessThanOrEqual(21 + 1e-12)
    }), { numRuns: 500 })
  })

  it('names the bad colour', () => {
    expect(() => contrastRatio('#fff', 'white')).toThrowError('colour B "white": expected a hex colour')
  })
})

describe('hexToLab (sRGB, D65 white)', () => {
  it.each([
    // [hex, L, a, b, digits, source]
    ['#ffffff', 100, 0, 0, 8, 'definition: the D65 white is L 100, a 0, b 0 (published, CIE 15)'],
    ['#000000', 0, 0, 0, 8, 'definition: black is L 0 (published, CIE 15)'],
    // Lindbloom's calculator uses a 4-decimal matrix and white, so it differs from the
    // CSS Color 4 matrix by about 0.004; two decimals are compared.
    ['#ff0000', 53.2408, 80.0925, 67.2032, 2, 'from memory: sRGB red in Lab D65 per Lindbloom\'s calculator'],
    ['#808080', 53.585, 0, 0, 2, 'from memory: sRGB mid grey L* ≈ 53.59, neutral'],
  ])('%s → Lab(%f, %f, %f) — %s', (hex, L, a, b, digits) => {
    const lab = hexToLab(hex)
    expect(lab.L).toBeCloseTo(L, digits)
    expect(lab.a).toBeCloseTo(a, digits)
    expect(lab.b).toBeCloseTo(b, digits)
  })

  const checkAgainstCulori = (hex: string) => {
    const ours = hexToLab(hex)
    const theirs = toLab65(hex)!
    expect(ours.L).toBeCloseTo(theirs.l, 9)
    expect(ours.a).toBeCloseTo(theirs.a, 9)
    expect(ours.b).toBeCloseTo(theirs.b, 9)
  }

  it.each(['#ff0000', '#00ff00', '#0000ff', '#1a2b3c', '#c0ffee', '#7f7f7f', '#0a0a0a', '#fedcba'])(
    '%s agrees with culori lab65 (independent oracle)', checkAgainstCulori)

  it('agrees with culori lab65 on random colours', () => {
    fc.assert(fc.property(hexArb, checkAgainstCulori), { numRuns: 500 })
  })

  it('is not culori\'s D50 lab (the white point matters)', () => {
    const d50 = converter('lab')('#0000ff')!
    expect(Math.abs(hexToLab('#0000ff').b - d50.b)).toBeGreaterThan(0.1)
  })
})

describe('CIEDE2000', () => {
  // published (Sharma, Wu, Dalal 2005, Table 1): G. Sharma, W. Wu, E. N. Dalal,
  // "The CIEDE2000 color-difference formula: implementation notes, supplementary
  // test data, and mathematical observations", Color Res. Appl. 30(1):21–30.
  // Values reproduced from memory of the table; every row is also checked against
  // culori and color-diff below so a misremembered row would show.
  // [pair, L1, a1, b1, L2, a2, b2, ΔE00]
  const sharmaTable1: [number, number, number, number, number, number, number, number][] = [
    [1, 50.0000, 2.6772, -79.7751, 50.0000, 0.0000, -82.7485, 2.0425],
    [2, 50.0000, 3.1571, -77.2803, 50.0000, 0.0000, -82.7485, 2.8615],
    [3, 50.0000, 2.8361, -74.0200, 50.0000, 0.0000, -82.7485, 3.4412],
    [4, 50.0000, -1.3802, -84.2814, 50.0000, 0.0000, -82.7485, 1.0000],
    [5, 50.0000, -1.1848, -84.8006, 50.0000, 0.0000, -82.7485, 1.0000],
    [6, 50.0000, -0.9009, -85.5211, 50.0000, 0.0000, -82.7485, 1.0000],
    [7, 50.0000, 0.0000, 0.0000, 50.0000, -1.0000, 2.0000, 2.3669],
    [8, 50.0000, -1.0000, 2.0000, 50.0000, 0.0000, 0.0000, 2.3669],
    [9, 50.0000, 2.4900, -0.0010, 50.0000, -2.4900, 0.0009, 7.1792],
    [10, 50.0000, 2.4900, -0.0010, 50.0000, -2.4900, 0.0010, 7.1792],
    [11, 50.0000, 2.4900, -0.0010, 50.0000, -2.4900, 0.0011, 7.2195],
    [12, 50.0000, 2.4900, -0.0010, 50.0000, -2.4900, 0.0012, 7.2195],
    [13, 50.0000, -0.0010, 2.4900, 50.0000, 0.0009, -2.4900, 4.8045],
    [14, 50.0000, -0.0010, 2.4900, 50.0000, 0.0010, -2.4900, 4.8045],
    [15, 50.0000, -0.0010, 2.4900, 50.0000, 0.0011, -2.4900, 4.7461],
    [16, 50.0000, 2.5000, 0.0000, 50.0000, 0.0000, -2.5000, 4.3065],
    [17, 50.0000, 2.5000, 0.0000, 73.0000, 25.0000, -18.0000, 27.1492],
    [18, 50.0000, 2.5000, 0.0000, 61.0000, -5.0000, 29.0000, 22.8977],
    [19, 50.0000, 2.5000, 0.0000, 56.0000, -27.0000, -3.0000, 31.9030],
    [20, 50.0000, 2.5000, 0.0000, 58.0000, 24.0000, 15.0000, 19.4535],
    [21, 50.0000, 2.5000, 0.0000, 50.0000, 3.1736, 0.5854, 1.0000],
    [22, 50.0000, 2.5000, 0.0000, 50.0000, 3.2972, 0.0000, 1.0000],
    [23, 50.0000, 2.5000, 0.0000, 50.0000, 1.8634, 0.5757, 1.0000],
    [24, 50.0000, 2.5000, 0.0000, 50.0000, 3.2592, 0.3350, 1.0000],
    [25, 60.2574, -34.0099, 36.2677, 60.4626, -34.1751, 39.4387, 1.2644],
    [26, 63.0109, -31.0961, -5.8663, 62.8187, -29.7946, -4.0864, 1.2630],
    [27, 61.2901, 3.7196, -5.3901, 61.4292, 2.2480, -4.9620, 1.8731],
    [28, 35.0831, -44.1164, 3.7933, 35.0232, -40.0716, 1.5901, 1.8645],
    [29, 22.7233, 20.0904, -46.6940, 23.0331, 14.9730, -42.5619, 2.0373],
    [30, 36.4612, 47.8580, 18.3852, 36.2715, 50.5065, 21.2231, 1.4146],
    [31, 90.8027, -2.0831, 1.4410, 91.1528, -1.6435, 0.0447, 1.4441],
    [32, 90.9257, -0.5406, -0.9208, 88.6381, -0.8985, -0.7239, 1.5381],
    [33, 6.7747, -0.2908, -2.4247, 5.8714, -0.0985, -2.2286, 0.6377],
    [34, 2.0776, 0.0795, -1.1350, 0.9033, -0.0636, -0.5514, 0.9082],
  ]

  it('the table has all 34 pairs', () => {
    expect(sharmaTable1.map(row => row[0])).toEqual(Array.from({ length: 34 }, (_, i) => i + 1))
  })

  it.each(sharmaTable1)(
    'pair %i: (%f, %f, %f) vs (%f, %f, %f) → %f — published (Sharma, Wu, Dalal 2005, Table 1)',
    (_pair, L1, a1, b1, L2, a2, b2, expected) => {
      const x = { L: L1, a: a1, b: b1 }
      const y = { L: L2, a: a2, b: b2 }
      // The table prints 4 decimals, so allow the rounding half-unit plus float noise.
      const tolerance = 1e-4
      expect(Math.abs(deltaE2000(x, y) - expected)).toBeLessThanOrEqual(tolerance)
      expect(Math.abs(deltaE2000(y, x) - expected)).toBeLessThanOrEqual(tolerance)
      // Independent implementations: each must agree with the remembered value too.
      expect(Math.abs(culoriDeltaE(culoriLab(x), culoriLab(y)) - expected)).toBeLessThanOrEqual(tolerance)
      expect(Math.abs(colorDiff(x, y) - expected)).toBeLessThanOrEqual(tolerance)
    },
  )

  const labArb = fc.record({
    L: fc.double({ min: 0, max: 100, noNaN: true }),
    a: fc.double({ min: -128, max: 128, noNaN: true }),
    b: fc.double({ min: -128, max: 128, noNaN: true }),
  })

  it('agrees with culori and color-diff on random Lab pairs', () => {
    fc.assert(fc.property(labArb, labArb, (x, y) => {
      const ours = deltaE2000(x, y)
      expect(ours).toBeCloseTo(culoriDeltaE(culoriLab(x), culoriLab(y)), 8)
      expect(ours).toBeCloseTo(colorDiff(x, y), 8)
    }), { numRuns: 1000 })
  })

  it('is zero for equal colours and symmetric', () => {
    fc.assert(fc.property(labArb, labArb, (x, y) => {
      expect(deltaE2000(x, x)).toBe(0)
      expect(deltaE2000(x, y)).toBeCloseTo(deltaE2000(y, x), 10)
    }), { numRuns: 300 })
  })

  it('rejects non-finite Lab values, naming the field', () => {
    expect(() => deltaE2000({ L: Number.NaN, a: 0, b: 0 }, { L: 50, a: 0, b: 0 }))
      .toThrowError('Lab A.L: expected a finite number, got NaN')
  })
})

describe('distinguishable (our rule: ΔE00 < 10 → hard; contrast < 1.5 → weak)', () => {
  it('declares its thresholds', () => {
    expect(DISTINGUISHABLE_RULE).toEqual({ minDeltaE: 10, minContrast: 1.5 })
  })

  it.each([
    // [yarn A, yarn B, verdict, why]
    ['#000000', '#ffffff', 'clear', 'black and white: ΔE00 100, contrast 21 (our rule)'],
    ['#808080', '#ffffff', 'clear', 'mid grey on white: contrast 3.95 (our rule)'],
    ['#1f3a93', '#c0392b', 'clear', 'navy and brick red: ΔE00 ≈ 43, contrast ≈ 1.85 (our rule)'],
    ['#cc0000', '#008000', 'weak', 'red and green of equal lightness: ΔE00 ≈ 69 but contrast ≈ 1.15 (our rule)'],
    ['#000000', '#000080', 'weak', 'black and navy: distinct hue, contrast ≈ 1.31 (our rule)'],
    ['#ffffff', '#ffff00', 'weak', 'white and yellow: contrast ≈ 1.07 (our rule)'],
    ['#aaaaaa', '#b0b0b0', 'hard', 'two near greys: ΔE00 ≈ 1.7 (our rule)'],
    ['#f5f0dc', '#e6d8b5', 'hard', 'cream and beige: ΔE00 ≈ 7.5 (our rule)'],
  ])('%s vs %s → %s — %s', (a, b, verdict) => {
    const judged = distinguishable(a, b)
    expect(judged.verdict).toBe(verdict)
    expect(judged.contrast).toBe(contrastRatio(a, b))
    expect(judged.deltaE).toBe(deltaE2000(hexToLab(a), hexToLab(b)))
    expect(judged.reason).toContain(`contrast ${judged.contrast.toFixed(2)}:1`)
  })

  it('follows the declared rule on random pairs', () => {
    fc.assert(fc.property(hexArb, hexArb, (a, b) => {
      const { deltaE, contrast, verdict } = distinguishable(a, b)
      const expected = deltaE < 10 ? 'hard' : contrast < 1.5 ? 'weak' : 'clear'
      expect(verdict).toBe(expected)
    }), { numRuns: 300 })
  })

  it('rejects a bad colour', () => {
    expect(() => distinguishable('#12345', '#fff')).toThrowError('colour A "#12345": expected a hex colour like #1a2b3c')
  })
})
