import type { H3Event } from 'h3'
import { decode as decodeWebp } from '@cwasm/webp'
import jpeg from 'jpeg-js'
import { PNG } from 'pngjs'
import { areaAverage, chartToRows, imageToChart, KnittingInputError, otsuThreshold } from '../../shared/knitting'
import { PICTURE_UPLOAD } from '../../shared/validation/motif'
import type { PicturePreviewFields } from '../../shared/validation/motif'
import { Motif } from '../db/models'
import type { chartRecord } from '../db/motifs'

// Pictures a motif is made from. The type is read from the bytes (magic numbers), never
// from the file name or the declared content type; the size in pixels is read from the
// header before anything is decoded, so a small file claiming a huge picture costs nothing.
//
// Answers: 400 a form field or the file is missing; 413 the file is over 5 MB;
// 415 not PNG, JPEG or WebP; 422 the file is damaged or the picture is over 4096 pixels a side
// or 4 megapixels.

export type PictureType = typeof PICTURE_UPLOAD.types[number]
export interface PictureUpload { bytes: Buffer; type: PictureType; width: number; height: number }

function corrupt(detail: string) {
  return createError({ statusCode: 422, message: `The picture could not be read: ${detail}` })
}

const u16be = (b: Buffer, i: number) => b.readUInt16BE(i)
const u24le = (b: Buffer, i: number) => b[i]! | (b[i + 1]! << 8) | (b[i + 2]! << 16)

/** The picture's type and size from its first bytes, or null when it is none of ours. */
export function sniffPicture(bytes: Buffer): { type: PictureType; width: number; height: number } | null {
  const ascii = (start: number, end: number) => bytes.subarray(start, end).toString('latin1')
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]))) {
    if (bytes.length < 24 || ascii(12, 16) !== 'IHDR') throw corrupt('the PNG header is missing or cut short')
    return { type: 'image/png', width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) }
  }
  if (bytes.length >= 3 && bytes[0] === 0xFF && bytes[1] === 0xD8 && bytes[2] === 0xFF) {
    // Walk the segments to the first start-of-frame marker, which holds the size.
    let i = 2
    while (i + 9 < bytes.length) {
      if (bytes[i] !== 0xFF) throw corrupt('the JPEG segments are damaged')
      const marker = bytes[i + 1]!
      if (marker === 0xFF) { i++; continue }
      const isFrame = marker >= 0xC0 && marker <= 0xCF && marker !== 0xC4 && marker !== 0xC8 && marker !== 0xCC
      if (isFrame) return { type: 'image/jpeg', width: u16be(bytes, i + 7), height: u16be(bytes, i + 5) }
      i += 2 + u16be(bytes, i + 2)
    }
    throw corrupt('the JPEG file ends before its picture size')
  }
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') {
    if (bytes.length < 30) throw corrupt('the WebP header is cut short')
    const chunk = ascii(12, 16)
    if (chunk === 'VP8X') return { type: 'image/webp', width: u24le(bytes, 24) + 1, height: u24le(bytes, 27) + 1 }
    if (chunk === 'VP8L') {
      if (bytes[20] !== 0x2F) throw corrupt('the lossless WebP header is damaged')
      const bits = bytes.readUInt32LE(21)
      return { type: 'image/webp', width: (bits & 0x3FFF) + 1, height: ((bits >>> 14) & 0x3FFF) + 1 }
    }
    if (chunk === 'VP8 ') {
      if (bytes[23] !== 0x9D || bytes[24] !== 0x01 || bytes[25] !== 0x2A) throw corrupt('the WebP frame header is damaged')
      return { type: 'image/webp', width: bytes.readUInt16LE(26) & 0x3FFF, height: bytes.readUInt16LE(28) & 0x3FFF }
    }
    throw corrupt(`unknown WebP chunk ${JSON.stringify(chunk)}`)
  }
  return null
}

/** Checks an uploaded file's size, type and picture size (in that order), decoding nothing. */
export function checkPicture(bytes: Buffer): PictureUpload {
  if (bytes.length > PICTURE_UPLOAD.maxBytes) {
    throw createError({ statusCode: 413, message: `The picture is ${(bytes.length / 1024 / 1024).toFixed(1)} MB; at most 5 MB is accepted` })
  }
  if (bytes.length === 0) throw fieldError('picture', 'the file is empty')
  const sniffed = sniffPicture(bytes)
  if (!sniffed) throw createError({ statusCode: 415, message: 'Only PNG, JPEG or WebP pictures can be used (this file is none of them)' })
  const { width, height } = sniffed
  if (width < 1 || height < 1) throw corrupt(`the picture claims to be ${width} × ${height} pixels`)
  if (width > PICTURE_UPLOAD.maxSide || height > PICTURE_UPLOAD.maxSide) {
    throw createError({ statusCode: 422, message: `The picture is ${width} × ${height} pixels; at most ${PICTURE_UPLOAD.maxSide} × ${PICTURE_UPLOAD.maxSide} is accepted` })
  }
  if (width * height > PICTURE_UPLOAD.maxPixels) {
    const count = (n: number) => n.toLocaleString('en-GB')
    const side = Math.floor(Math.sqrt(PICTURE_UPLOAD.maxPixels))
    throw createError({
      statusCode: 422,
      message: `The picture is ${width} × ${height} pixels, ${count(width * height)} in all; at most ${count(PICTURE_UPLOAD.maxPixels)} `
        + `(${PICTURE_UPLOAD.maxPixels / 1e6} megapixels, ${side} × ${side} for example) are accepted, plenty for the largest chart: make it smaller and try again`,
    })
  }
  return { bytes, ...sniffed }
}

/** RGBA pixels, top row first; a damaged file is a 422. */
export function decodePicture(picture: PictureUpload): { rgba: Uint8Array; width: number; height: number } {
  let decoded: { data: ArrayLike<number>; width: number; height: number }
  try {
    if (picture.type === 'image/png') decoded = PNG.sync.read(picture.bytes)
    else if (picture.type === 'image/jpeg') decoded = jpeg.decode(picture.bytes, { useTArray: true, formatAsRGBA: true, maxResolutionInMP: PICTURE_UPLOAD.maxPixels / 1e6, maxMemoryUsageInMB: 256 })
    else decoded = decodeWebp(picture.bytes)
  }
  catch (e) {
    throw corrupt((e as Error).message || 'the file is damaged')
  }
  if (decoded.width !== picture.width || decoded.height !== picture.height) {
    throw corrupt(`the header says ${picture.width} × ${picture.height} pixels but the picture is ${decoded.width} × ${decoded.height}`)
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

/** The chart a picture makes with the form's size, threshold and invert. */
export function pictureChart(picture: PictureUpload, fields: Pick<PicturePreviewFields, 'width' | 'height' | 'threshold' | 'invert'>) {
  const { rgba, width, height } = decodePicture(picture)
  const target = { width: fields.width, height: fields.height }
  try {
    const otsu = otsuFor(rgba, width, height, target)
    const threshold = fields.threshold ?? otsu
    const chart = imageToChart(rgba, width, height, { ...target, threshold, invert: fields.invert ?? false })
    return { chart, threshold, otsu, rows: chartToRows(chart) }
  }
  catch (e) {
    if (e instanceof KnittingInputError) throw fieldError(e.field ?? 'picture', e.message)
    throw e
  }
}

/** The multipart form of a picture route: its text fields and the `picture` file's bytes. */
export async function readPictureForm(event: H3Event): Promise<{ fields: Record<string, string>; file: Buffer | undefined }> {
  if (!(getRequestHeader(event, 'content-type') ?? '').toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 400, message: 'Send the picture as multipart/form-data with a "picture" file' })
  }
  const parts = (await readMultipartFormData(event)) ?? []
  const fields: Record<string, string> = {}
  let file: Buffer | undefined
  for (const part of parts) {
    if (part.name === 'picture') file = part.data
    else if (part.name && part.filename === undefined) fields[part.name] = part.data.toString('utf8')
  }
  return { fields, file }
}

/** The uploaded file, checked (size, type by its bytes, picture size) but not decoded. */
export function requirePictureFile(file: Buffer | undefined): PictureUpload {
  if (!file) throw fieldError('picture', 'choose a picture file (PNG, JPEG or WebP)')
  return checkPicture(file)
}

// Originals are kept in Nitro storage (`pictures` mount, see nuxt.config.ts), keyed by motif id.
const pictureKey = (motifId: number) => String(motifId)

export async function savePicture(motifId: number, bytes: Buffer) {
  await useStorage('pictures').setItemRaw(pictureKey(motifId), bytes)
}

export async function readPicture(motifId: number): Promise<Buffer | null> {
  const raw = await useStorage('pictures').getItemRaw(pictureKey(motifId))
  if (!raw) return null
  return Buffer.isBuffer(raw) ? raw : Buffer.from(raw as Uint8Array)
}

export async function removePicture(motifId: number) {
  await useStorage('pictures').removeItem(pictureKey(motifId))
}

/**
 * Stores a motif made from a picture together with the original: the row is written in a
 * transaction that commits only after the picture is stored, and a picture whose row did
 * not commit is removed again, so neither is left without the other.
 */
export async function insertPictureMotif(draft: Pick<Motif, 'studioId' | 'name' | 'published' | 'createdBy' | 'updatedBy'> & ReturnType<typeof chartRecord>, picture: PictureUpload): Promise<number> {
  let stored = 0
  try {
    return await useDb().transaction(async (transaction) => {
      const motif = await Motif.create({ ...draft, pictureType: picture.type }, { transaction })
      stored = motif.id
      await savePicture(motif.id, picture.bytes)
      return motif.id
    })
  }
  catch (e) {
    if (stored) await removePicture(stored).catch(() => { /* nothing was stored */ })
    throw e
  }
}
