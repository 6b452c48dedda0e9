// Gauge and sizing from a measured swatch.
//
// Rounding rule (declared): counts round to the nearest whole stitch or row,
// a half rounds up. Values within 1e-9 of a half count as the half, so that
// 9 in at 5.5 sts/in gives 50 stitches despite binary floating point.

import { KnittingInputError } from './errors'
import type { Gauge, SwatchMeasure } from './types'
import { CM_PER_4_IN, CM_PER_INCH } from './units'
import { requireInteger, requireNonNegative, requirePositive } from './validate'

/** Nearest whole number, a half rounding up (with a 1e-9 tolerance for float noise). */
export function roundHalfUp(x: number): number {
  return Math.floor(x + 0.5 + 1e-9)
}

function fromDensity(stitchesPer10cm: number, rowsPer10cm: number): Gauge {
  return {
    stitchesPer10cm,
    rowsPer10cm,
    stitchWidthMm: 100 / stitchesPer10cm,
    rowHeightMm: 100 / rowsPer10cm,
  }
}

/** Gauge from a swatch: `stitches` × `rows` measured over `widthCm` × `heightCm`. */
export function gaugeFromSwatch(s: SwatchMeasure): Gauge {
  if (typeof s !== 'object' || s === null) {
    throw new KnittingInputError('swatch: expected { stitches, rows, widthCm, heightCm }', { field: 'swatch' })
  }
  const stitches = requireInteger(s.stitches, 'swatch.stitches', 1)
  const rows = requireInteger(s.rows, 'swatch.rows', 1)
  const widthCm = requirePositive(s.widthCm, 'swatch.widthCm')
  const heightCm = requirePositive(s.heightCm, 'swatch.heightCm')
  return {
    stitchesPer10cm: stitches / widthCm * 10,
    rowsPer10cm: rows / heightCm * 10,
    stitchWidthMm: widthCm * 10 / stitches,
    rowHeightMm: heightCm * 10 / rows,
  }
}

/** Gauge from counts per 10 cm. */
export function gaugePer10cm(g: { stitchesPer10cm: number; rowsPer10cm: number }): Gauge {
  return fromDensity(requirePositive(g.stitchesPer10cm, 'stitchesPer10cm'), requirePositive(g.rowsPer10cm, 'rowsPer10cm'))
}

/** Gauge from counts per 4 in (4 in = 10.16 cm exactly). */
export function gaugeFromPer4in(g: { stitchesPer4in: number; rowsPer4in: number }): Gauge {
  const s = requirePositive(g.stitchesPer4in, 'stitchesPer4in')
  const r = requirePositive(g.rowsPer4in, 'rowsPer4in')
  return fromDensity(s * 10 / CM_PER_4_IN, r * 10 / CM_PER_4_IN)
}

/** Gauge from counts per inch. */
export function gaugeFromPerInch(g: { stitchesPerInch: number; rowsPerInch: number }): Gauge {
  const s = requirePositive(g.stitchesPerInch, 'stitchesPerInch')
  const r = requirePositive(g.rowsPerInch, 'rowsPerInch')
  return fromDensity(s * 10 / CM_PER_INCH, r * 10 / CM_PER_INCH)
}

/** The same gauge per 4 in. */
export function gaugePer4in(g: Gauge): { stitchesPer4in: number; rowsPer4in: number } {
  checkGauge(g)
  return { stitchesPer4in: g.stitchesPer10cm * CM_PER_4_IN / 10, rowsPer4in: g.rowsPer10cm * CM_PER_4_IN / 10 }
}

/** The same gauge per inch. */
export function gaugePerInch(g: Gauge): { stitchesPerInch: number; rowsPerInch: number } {
  checkGauge(g)
  return { stitchesPerInch: g.stitchesPer10cm * CM_PER_INCH / 10, rowsPerInch: g.rowsPer10cm * CM_PER_INCH / 10 }
}

function checkGauge(g: Gauge): void {
  if (typeof g !== 'object' || g === null) {
    throw new KnittingInputError('gauge: expected { stitchesPer10cm, rowsPer10cm, … }', { field: 'gauge' })
  }
  requirePositive(g.stitchesPer10cm, 'gauge.stitchesPer10cm')
  requirePositive(g.rowsPer10cm, 'gauge.rowsPer10cm')
}

/** Stitches for a width, to the nearest whole stitch (half up). */
export function stitchesForWidth(widthCm: number, gauge: Gauge): number {
  requireNonNegative(widthCm, 'widthCm')
  checkGauge(gauge)
  return roundHalfUp(widthCm * gauge.stitchesPer10cm / 10)
}

/** Rows for a length, to the nearest whole row (half up). */
export function rowsForLength(lengthCm: number, gauge: Gauge): number {
  requireNonNegative(lengthCm, 'lengthCm')
  checkGauge(gauge)
  return roundHalfUp(lengthCm * gauge.rowsPer10cm / 10)
}

/**
 * Round a stitch count to a whole number of repeats of `repeat` stitches:
 * 'nearest' (half up), 'up' or 'down'; never below one repeat.
 */
export function roundToRepeat(stitches: number, repeat: number, mode: 'nearest' | 'up' | 'down' = 'nearest'): number {
  requireNonNegative(stitches, 'stitches')
  requireInteger(repeat, 'repeat', 1)
  if (mode !== 'nearest' && mode !== 'up' && mode !== 'down') {
    throw new KnittingInputError(`rounding: expected "nearest", "up" or "down", got ${JSON.stringify(mode)}`, { field: 'rounding' })
  }
  const q = stitches / repeat
  const n = mode === 'up' ? Math.ceil(q - 1e-9) : mode === 'down' ? Math.floor(q + 1e-9) : roundHalfUp(q)
  return Math.max(1, n) * repeat
}
