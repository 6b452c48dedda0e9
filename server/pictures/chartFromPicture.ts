import { decode as decodeWebp } from '@cwasm/webp'
import jpeg from 'jpeg-js'
import { PNG } from 'pngjs'
import { areaAverage, chartToRows, imageToChart, otsuThreshold } from '#shared/engine'
import type { Chart } from '#shared/engine'
import { PICTURE_UPLOAD } from '#shared/motif/limits'

// Decoding a picture and turning it into a chart: the costly part of a picture upload, run
// in a worker thread (decodeWorker.ts), so plain code with no h3 or Nitro in it.

export type PictureType = typeof PICTURE_UPLOAD.types[number]

/** What a worker is given: the checked file, its type and header size, and the form's chart settings. */
export interface PictureChartJob {
  bytes: Uint8Array
  type: PictureType
  width: number
  height: number
  target: { width: number; height: number; threshold?: number; invert?: boolean }
}

export interface PictureChartResult { chart: Chart; threshold: number; otsu: number; rows: string[] }

/** The file could not be decoded; the message says why, for the person who sent it. */
export class UnreadablePictureError extends Error {}

/** RGBA pixels, top row first. */
function decodePicture(job: PictureChartJob): { rgba: Uint8Array; width: number; height: number } {
  let decoded: { data: ArrayLike<number>; width: number; height: number }
  try {
    if (job.type === 'image/png') decoded = PNG.sync.read(Buffer.from(job.bytes.buffer, job.bytes.byteOffset, job.bytes.byteLength))
    else if (job.type === 'image/jpeg')
      decoded = jpeg.decode(job.bytes, { useTArray: true, formatAsRGBA: true, maxResolutionInMP: PICTURE_UPLOAD.maxPixels / 1e6, maxMemoryUsageInMB: 256 })
    else decoded = decodeWebp(job.bytes)
  }
  catch (e) {
    throw new UnreadablePictureError((e as Error).message || 'the file is damaged')
  }
  if (decoded.width !== job.width || decoded.height !== job.height) {
    throw new UnreadablePictureError(`the header says ${job.width} × ${job.height} pixels but the picture is ${decoded.width} × ${decoded.height}`)
  }
  const rgba = decoded.data instanceof Uint8Array ? decoded.data : Uint8Array.from(decoded.data)
  return { rgba, width: decoded.width, height: decoded.height }
}

/**
 * Otsu's threshold for the picture at chart size, on the same grey levels imageToChart
 * uses (composited over white, Rec. 709 weights, area-averaged, rounded). The engine
 * picks Otsu's value itself when no threshold is given but does not say which it was;
 * the preview shows it. Rows are narrowed one at a time with the engine's areaAverage and
 * then averaged down, which adds the same terms in the same order as imageToChart.
 */
function otsuFor(rgba: Uint8Array, width: number, height: number, target: { width: number; height: number }) {
  const grey = new Float64Array(width)
  const narrowed = new Float64Array(height * target.width)
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4
      const alpha = rgba[i + 3]! / 255
      const white = 255 * (1 - alpha)
      grey[x] = 0.2126 * (rgba[i]! * alpha + white) + 0.7152 * (rgba[i + 1]! * alpha + white) + 0.0722 * (rgba[i + 2]! * alpha + white)
    }
    narrowed.set(areaAverage(grey, width, 1, target.width, 1), y * target.width)
  }
  const cells = areaAverage(narrowed, target.width, height, target.width, target.height)
  const histogram = new Float64Array(256)
  for (const value of cells) histogram[Math.min(255, Math.max(0, Math.round(value + 1e-9)))]! += 1
  return otsuThreshold(histogram)
}

/**
 * The chart a picture makes with the form's size, threshold and invert. Throws
 * UnreadablePictureError for a damaged file and the engine's KnittingInputError for settings
 * it refuses.
 */
export function chartFromPicture(job: PictureChartJob): PictureChartResult {
  const { rgba, width, height } = decodePicture(job)
  const { target } = job
  const otsu = otsuFor(rgba, width, height, target)
  const threshold = target.threshold ?? otsu
  const chart = imageToChart(rgba, width, height, { width: target.width, height: target.height, threshold, invert: target.invert ?? false })
  return { chart, threshold, otsu, rows: chartToRows(chart) }
}
