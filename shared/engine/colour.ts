// Colour arithmetic for judging two yarns against each other: hex parsing,
// WCAG 2.x contrast, CIELAB (D65) and the CIEDE2000 colour difference.
// Pure functions over plain data.

import { KnittingInputError } from './errors'

/** CIELAB coordinates, D65 white (L 0..100, a and b roughly −128..127). */
export interface Lab {
  L: number
  a: number
  b: number
}

/** 8-bit sRGB channels 0..255. */
export interface Rgb8 {
  r: number
  g: number
  b: number
}

const HEX_COLOUR = /^#(?:[0-9a-f]{3}|[0-9a-f]{6})$/i

/**
 * Parse `#rgb` or `#rrggbb` (any case). The `#` is required so that a typo
 * such as "12345" is reported instead of guessed at.
 */
export function parseHexColour(hex: string, field = 'colour'): Rgb8 {
  if (typeof hex !== 'string' || !HEX_COLOUR.test(hex)) {
    throw new KnittingInputError(
      `${field} ${JSON.stringify(hex)}: expected a hex colour like #1a2b3c or #abc`,
      { field },
    )
  }
  const digits = hex.length === 4
    ? hex.slice(1).split('').map(d => d + d).join('')
    : hex.slice(1)
  return {
    r: Number.parseInt(digits.slice(0, 2), 16),
    g: Number.parseInt(digits.slice(2, 4), 16),
    b: Number.parseInt(digits.slice(4, 6), 16),
  }
}

/** Lower-case `#rrggbb` form, so colours compare and store the same way. */
export function normaliseHexColour(hex: string, field = 'colour'): string {
  const { r, g, b } = parseHexColour(hex, field)
  return '#' + [r, g, b].map(v => v.toString(16).padStart(2, '0')).join('')
}

/**
 * sRGB transfer function inverse (IEC 61966-2-1). WCAG 2.0 printed 0.03928
 * as the knee, later versions 0.04045; no 8-bit value lies between the two
 * (10/255 ≈ 0.0392, 11/255 ≈ 0.0431), so the results are identical.
 */
function srgbChannelToLinear(channel8: number): number {
  const c = channel8 / 255
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
}

/** WCAG 2.x relative luminance, 0 (black) .. 1 (white). */
export function relativeLuminance(hex: string, field = 'colour'): number {
  const { r, g, b } = parseHexColour(hex, field)
  return 0.2126 * srgbChannelToLinear(r)
    + 0.7152 * srgbChannelToLinear(g)
    + 0.0722 * srgbChannelToLinear(b)
}

/** WCAG 2.x contrast ratio (L1 + 0.05) / (L2 + 0.05), 1..21, unrounded. */
export function contrastRatio(hexA: string, hexB: string): number {
  const la = relativeLuminance(hexA, 'colour A')
  const lb = relativeLuminance(hexB, 'colour B')
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05)
}

// sRGB (linear) → XYZ, D65, as in CSS Color 4; the white point is derived
// from the chromaticity x 0.3127, y 0.3290 so that #ffffff maps to L 100, a 0, b 0.
const D65_WHITE = { X: 0.3127 / 0.329, Y: 1, Z: (1 - 0.3127 - 0.329) / 0.329 }
const LAB_EPSILON = 216 / 24389 // (6/29)^3
const LAB_KAPPA = 24389 / 27 // (29/3)^3

function labF(t: number): number {
  return t > LAB_EPSILON ? Math.cbrt(t) : (LAB_KAPPA * t + 16) / 116
}

/** CIELAB of an sRGB hex colour, D65 white (no chromatic adaptation to D50). */
export function hexToLab(hex: string): Lab {
  const { r, g, b } = parseHexColour(hex)
  const lr = srgbChannelToLinear(r)
  const lg = srgbChannelToLinear(g)
  const lb = srgbChannelToLinear(b)
  const x = 0.4123907992659593 * lr + 0.357584339383878 * lg + 0.1804807884018343 * lb
  const y = 0.2126390058715102 * lr + 0.715168678767756 * lg + 0.0721923153607337 * lb
  const z = 0.0193308187155918 * lr + 0.119194779794626 * lg + 0.9505321522496607 * lb
  const fx = labF(x / D65_WHITE.X)
  const fy = labF(y / D65_WHITE.Y)
  const fz = labF(z / D65_WHITE.Z)
  return { L: 116 * fy - 16, a: 500 * (fx - fy), b: 200 * (fy - fz) }
}

function checkLab(lab: Lab, field: string): void {
  for (const key of ['L', 'a', 'b'] as const) {
    if (typeof lab?.[key] !== 'number' || !Number.isFinite(lab[key])) {
      throw new KnittingInputError(`${field}.${key}: expected a finite number, got ${String(lab?.[key])}`, { field: `${field}.${key}` })
    }
  }
}

const DEG = Math.PI / 180
const POW25_7 = 25 ** 7

/** Hue angle in degrees 0..360; 0 when a = b = 0 (as in Sharma et al. 2005, eq. 4). */
function hueDegrees(b: number, aPrime: number): number {
  if (b === 0 && aPrime === 0) return 0
  const h = Math.atan2(b, aPrime) / DEG
  return h < 0 ? h + 360 : h
}

/**
 * CIEDE2000 colour difference with kL = kC = kH = 1, following the equations
 * and hue-angle conventions of Sharma, Wu & Dalal (2005). Symmetric in a, b.
 */
export function deltaE2000(a: Lab, b: Lab): number {
  checkLab(a, 'Lab A')
  checkLab(b, 'Lab B')
  const c1 = Math.hypot(a.a, a.b)
  const c2 = Math.hypot(b.a, b.b)
  const cMean7 = ((c1 + c2) / 2) ** 7
  const g = 0.5 * (1 - Math.sqrt(cMean7 / (cMean7 + POW25_7)))
  const a1p = (1 + g) * a.a
  const a2p = (1 + g) * b.a
  const c1p = Math.hypot(a1p, a.b)
  const c2p = Math.hypot(a2p, b.b)
  const h1p = hueDegrees(a.b, a1p)
  const h2p = hueDegrees(b.b, a2p)

  const dLp = b.L - a.L
  const dCp = c2p - c1p
  const chromaProduct = c1p * c2p
  let dhp = 0
  if (chromaProduct !== 0) {
    dhp = h2p - h1p
    if (dhp > 180) dhp -= 360
    else if (dhp < -180) dhp += 360
  }
  const dHp = 2 * Math.sqrt(chromaProduct) * Math.sin((dhp / 2) * DEG)

  const lMean = (a.L + b.L) / 2
  const cMeanP = (c1p + c2p) / 2
  let hMean = h1p + h2p
  if (chromaProduct !== 0) {
    if (Math.abs(h1p - h2p) <= 180) hMean /= 2
    else hMean = hMean < 360 ? (hMean + 360) / 2 : (hMean - 360) / 2
  }

  const t = 1
    - 0.17 * Math.cos((hMean - 30) * DEG)
    + 0.24 * Math.cos(2 * hMean * DEG)
    + 0.32 * Math.cos((3 * hMean + 6) * DEG)
    - 0.20 * Math.cos((4 * hMean - 63) * DEG)
  const dTheta = 30 * Math.exp(-(((hMean - 275) / 25) ** 2))
  const cMeanP7 = cMeanP ** 7
  const rc = 2 * Math.sqrt(cMeanP7 / (cMeanP7 + POW25_7))
  const lShift = (lMean - 50) ** 2
  const sl = 1 + (0.015 * lShift) / Math.sqrt(20 + lShift)
  const sc = 1 + 0.045 * cMeanP
  const sh = 1 + 0.015 * cMeanP * t
  const rt = -Math.sin(2 * dTheta * DEG) * rc

  const termL = dLp / sl
  const termC = dCp / sc
  const termH = dHp / sh
  return Math.sqrt(termL * termL + termC * termC + termH * termH + rt * termC * termH)
}

/**
 * Our rule for "can a knitter tell these two yarns apart" (common practice,
 * not a published standard; the numbers are Floatwise's declared thresholds):
 * - hard:  ΔE00 < 10. The colours themselves are close; the motif blurs even
 *          in good light (ΔE00 ≈ 1 is a just-noticeable difference for flat
 *          patches; a knitted fabric mixes and shades, so we ask for far more).
 * - weak:  ΔE00 ≥ 10 but WCAG contrast < 1.5. Different hues of about the
 *          same lightness: the pattern reads in daylight but fades in low
 *          light, in greyscale photos and photocopies, and to colour-blind eyes.
 * - clear: ΔE00 ≥ 10 and contrast ≥ 1.5.
 * Both numbers are always returned so the app can show them.
 */
export const DISTINGUISHABLE_RULE = Object.freeze({
  minDeltaE: 10,
  minContrast: 1.5,
})

export type DistinguishableVerdict = 'clear' | 'weak' | 'hard'

export interface Distinguishability {
  deltaE: number
  contrast: number
  verdict: DistinguishableVerdict
  reason: string
}

export function distinguishable(hexA: string, hexB: string): Distinguishability {
  const contrast = contrastRatio(hexA, hexB)
  const deltaE = deltaE2000(hexToLab(hexA), hexToLab(hexB))
  const shown = `ΔE00 ${deltaE.toFixed(1)}, contrast ${contrast.toFixed(2)}:1`
  if (deltaE < DISTINGUISHABLE_RULE.minDeltaE) {
    return {
      deltaE, contrast, verdict: 'hard',
      reason: `${shown}: the colours are close (ΔE00 below ${DISTINGUISHABLE_RULE.minDeltaE}); the pattern will blur even in good light`,
    }
  }
  if (contrast < DISTINGUISHABLE_RULE.minContrast) {
    return {
      deltaE,
      contrast,
      verdict: 'weak',
      reason: `${shown}: the hues differ but the lightness is about the same (contrast below ${DISTINGUISHABLE_RULE.minContrast}:1); the pattern fades in low light, greyscale photos and photocopies`,
    }
  }
  return {
    deltaE, contrast, verdict: 'clear',
    reason: `${shown}: different colours with enough light–dark contrast`,
  }
}
