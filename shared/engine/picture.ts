// Picture → two-colour chart: composite over white, grey, area-average down
// to the chart size, threshold (Otsu unless given). Pure functions over
// plain data; the caller decodes the image file.

import { KnittingInputError } from './errors'
import type { Chart } from './types'

/** Declared size limits for a picture and the chart made from it. */
export const PICTURE_LIMITS = Object.freeze({
  maxSourceWidth: 4096,
  maxSourceHeight: 4096,
  maxChartWidth: 200,
  maxChartHeight: 500,
})

function checkSize(value: number, field: string, max: number): void {
  if (!Number.isInteger(value) || value < 1 || value > max) {
    throw new KnittingInputError(`${field}: expected a whole number from 1 to ${max}, got ${String(value)}`, { field })
  }
}

/**
 * Exact fractional-coverage weights for resampling `srcCount` pixels onto
 * `dstCount` cells along one axis. Working in units of 1/(srcCount·dstCount)
 * keeps every overlap an integer: source pixel j spans [j·dst, (j+1)·dst],
 * cell i spans [i·src, (i+1)·src]; the weight is overlap / src, so each
 * cell's weights sum to 1.
 */
function coverageWeights(srcCount: number, dstCount: number): { first: number; weights: Float64Array }[] {
  const cells = []
  for (let i = 0; i < dstCount; i++) {
    const start = i * srcCount
    const end = start + srcCount
    const first = Math.floor(start / dstCount)
    const last = Math.ceil(end / dstCount) - 1
    const weights = new Float64Array(last - first + 1)
    for (let j = first; j <= last; j++) {
      const overlap = Math.min((j + 1) * dstCount, end) - Math.max(j * dstCount, start)
      weights[j - first] = overlap / srcCount
    }
    cells.push({ first, weights })
  }
  return cells
}

/**
 * Area-average a grid given row by row: `readRow(y, out)` fills `out`
 * (length srcWidth) with source row y. Rows are reduced horizontally as they
 * arrive, so a 4096-wide picture never needs a full-size grey copy.
 */
function areaAverageRows(
  readRow: (y: number, out: Float64Array) => void,
  srcWidth: number, srcHeight: number, dstWidth: number, dstHeight: number,
): Float64Array {
  const across = coverageWeights(srcWidth, dstWidth)
  const down = coverageWeights(srcHeight, dstHeight)
  const rowIn = new Float64Array(srcWidth)
  const narrowed = new Float64Array(srcHeight * dstWidth)
  for (let y = 0; y < srcHeight; y++) {
    readRow(y, rowIn)
    for (let x = 0; x < dstWidth; x++) {
      const { first, weights } = across[x]!
      let sum = 0
      for (let k = 0; k < weights.length; k++) sum += weights[k]! * rowIn[first + k]!
      narrowed[y * dstWidth + x] = sum
    }
  }
  const out = new Float64Array(dstWidth * dstHeight)
  for (let ty = 0; ty < dstHeight; ty++) {
    const { first, weights } = down[ty]!
    for (let k = 0; k < weights.length; k++) {
      const w = weights[k]!
      const base = (first + k) * dstWidth
      for (let x = 0; x < dstWidth; x++) out[ty * dstWidth + x]! += w * narrowed[base + x]!
    }
  }
  return out
}

/**
 * Area-average a single-channel grid (row-major, row 0 first) to a new size.
 * Each source pixel contributes to a target cell in proportion to the area
 * they overlap, also when the sizes do not divide: [0,10,20,30,40,50] (6×1)
 * to 3×1 gives [5, 25, 45]; to 4×1 gives [10/3, 50/3, 100/3, 140/3].
 */
export function areaAverage(
  values: ArrayLike<number>, srcWidth: number, srcHeight: number,
  dstWidth: number, dstHeight: number,
): Float64Array {
  checkSize(srcWidth, 'source width', PICTURE_LIMITS.maxSourceWidth)
  checkSize(srcHeight, 'source height', PICTURE_LIMITS.maxSourceHeight)
  checkSize(dstWidth, 'target width', PICTURE_LIMITS.maxSourceWidth)
  checkSize(dstHeight, 'target height', PICTURE_LIMITS.maxSourceHeight)
  if (values.length !== srcWidth * srcHeight) {
    throw new KnittingInputError(
      `values: expected ${srcWidth * srcHeight} numbers (${srcWidth} × ${srcHeight}), got ${values.length}`,
      { field: 'values' },
    )
  }
  return areaAverageRows((y, out) => {
    for (let x = 0; x < srcWidth; x++) {
      const v = values[y * srcWidth + x]!
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw new KnittingInputError(`values[${y * srcWidth + x}]: expected a finite number, got ${String(v)}`, { field: 'values' })
      }
      out[x] = v
    }
  }, srcWidth, srcHeight, dstWidth, dstHeight)
}

/**
 * Otsu (1979): the threshold t that maximises the between-class variance
 * when levels 0..t form the dark class and t+1.. the light class.
 * Declared tie rule: the smallest t reaching the maximum, so across a run of
 * empty bins t is the last occupied level of the dark class (every t in the
 * run splits the pixels the same way). With fewer than two occupied levels
 * there is nothing to split; t is then the middle of the range,
 * ⌊(levels − 1) / 2⌋, so a uniformly dark picture is all dark and a light one
 * all light.
 */
export function otsuThreshold(histogram: ArrayLike<number>): number {
  const levels = histogram?.length
  if (typeof levels !== 'number' || levels < 2) {
    throw new KnittingInputError(`histogram: expected at least 2 bins, got ${String(levels)}`, { field: 'histogram' })
  }
  let total = 0
  let weightedTotal = 0
  let occupied = 0
  for (let i = 0; i < levels; i++) {
    const count = histogram[i]!
    if (typeof count !== 'number' || !Number.isFinite(count) || count < 0) {
      throw new KnittingInputError(`histogram[${i}]: expected a count ≥ 0, got ${String(count)}`, { field: 'histogram' })
    }
    total += count
    weightedTotal += i * count
    if (count > 0) occupied++
  }
  if (total === 0) {
    throw new KnittingInputError('histogram: all counts are zero, there is nothing to threshold', { field: 'histogram' })
  }
  if (occupied < 2) return Math.floor((levels - 1) / 2)

  // σ_B²(t) ∝ (total·sum0 − w0·weightedTotal)² / (w0·w1); constant factors dropped.
  let best = -1
  let bestT = 0
  let w0 = 0
  let sum0 = 0
  for (let t = 0; t < levels - 1; t++) {
    w0 += histogram[t]!
    sum0 += t * histogram[t]!
    const w1 = total - w0
    if (w0 === 0 || w1 === 0) continue
    const spread = total * sum0 - w0 * weightedTotal
    const between = (spread * spread) / (w0 * w1)
    if (between > best) {
      best = between
      bestT = t
    }
  }
  return bestT
}

/** Round a grey value to its 0..255 level; halves round up. */
function greyLevel(grey: number): number {
  // The tiny nudge absorbs floating error such as 127.49999999999999 for (0 + 255) / 2.
  return Math.min(255, Math.max(0, Math.round(grey + 1e-9)))
}

export interface ImageToChartTarget {
  width: number
  height: number
  /** 0..255; averaged grey levels ≤ threshold become dark. Otsu when omitted. */
  threshold?: number
  /** Dark cells become main colour (0) and light ones contrast (1). */
  invert?: boolean
}

/**
 * Turn an RGBA picture (row-major, top row first, 8-bit channels, as a
 * canvas or PNG decoder gives it) into a two-colour chart.
 * - Transparency: each pixel is composited over white by its alpha
 *   (c·α/255 + 255·(1 − α/255)), so alpha 0 is white.
 * - Grey = 0.2126 R + 0.7152 G + 0.0722 B on the composited 8-bit values
 *   (gamma-encoded, not linear light).
 * - Grey is area-averaged down (or up) to the chart size, then rounded to a
 *   level 0..255; both a given threshold and Otsu (on the 256-bin histogram
 *   of these levels) compare the rounded level: level ≤ t is dark.
 * - Dark cells are contrast colour (1) unless `invert`.
 * - The picture's top row is the chart's top row, i.e. the last row knitted
 *   (chart row height − 1); the picture's left column is chart column 0.
 */
export function imageToChart(
  rgba: ArrayLike<number>, width: number, height: number,
  target: ImageToChartTarget,
): Chart {
  checkSize(width, 'picture width', PICTURE_LIMITS.maxSourceWidth)
  checkSize(height, 'picture height', PICTURE_LIMITS.maxSourceHeight)
  if (rgba?.length !== width * height * 4) {
    throw new KnittingInputError(
      `rgba: expected ${width * height * 4} values (${width} × ${height} pixels × 4 channels), got ${String(rgba?.length)}`,
      { field: 'rgba' },
    )
  }
  if (target === null || typeof target !== 'object') {
    throw new KnittingInputError('target: expected { width, height }', { field: 'target' })
  }
  checkSize(target.width, 'target width', PICTURE_LIMITS.maxChartWidth)
  checkSize(target.height, 'target height', PICTURE_LIMITS.maxChartHeight)
  const { threshold, invert = false } = target
  if (threshold !== undefined && (typeof threshold !== 'number' || !Number.isFinite(threshold) || threshold < 0 || threshold > 255)) {
    throw new KnittingInputError(`target threshold: expected a number from 0 to 255, got ${String(threshold)}`, { field: 'threshold' })
  }
  if (typeof invert !== 'boolean') {
    throw new KnittingInputError(`target invert: expected true or false, got ${String(invert)}`, { field: 'invert' })
  }

  const grey = areaAverageRows((y, out) => {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4
      for (let c = 0; c < 4; c++) {
        const v = rgba[i + c]!
        if (typeof v !== 'number' || !(v >= 0 && v <= 255)) {
          throw new KnittingInputError(
            `rgba[${i + c}] (pixel x ${x}, y ${y} from the top, ${'RGBA'[c]}): expected a value from 0 to 255, got ${String(v)}`,
            { field: 'rgba' },
          )
        }
      }
      const alpha = rgba[i + 3]! / 255
      const white = 255 * (1 - alpha)
      out[x] = 0.2126 * (rgba[i]! * alpha + white)
        + 0.7152 * (rgba[i + 1]! * alpha + white)
        + 0.0722 * (rgba[i + 2]! * alpha + white)
    }
  }, width, height, target.width, target.height)

  const levels = new Uint8Array(grey.length)
  const histogram = new Float64Array(256)
  for (let i = 0; i < grey.length; i++) {
    levels[i] = greyLevel(grey[i]!)
    histogram[levels[i]!]! += 1
  }
  const t = threshold ?? otsuThreshold(histogram)

  const cells = new Uint8Array(target.width * target.height)
  for (let ty = 0; ty < target.height; ty++) {
    const chartRow = target.height - 1 - ty
    for (let x = 0; x < target.width; x++) {
      const dark = levels[ty * target.width + x]! <= t
      cells[chartRow * target.width + x] = dark !== invert ? 1 : 0
    }
  }
  return { width: target.width, height: target.height, cells }
}
