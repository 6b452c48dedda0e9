import type { H3Event } from 'h3'
import { PICTURE_UPLOAD } from '#shared/motif/limits'
import type { PicturePreviewFields } from '#shared/validation/motifs'
import type { PictureType } from '../pictures/chartFromPicture'
import { chartInWorker, DecoderFailedError, DecodeRefusal, decodeQueue, DecodeTimeoutError } from '../pictures/decodePool'
import { QueueFullError } from '../pictures/decodeQueue'
import { Motif } from '../db/models'
import type { chartRecord } from '../db/motifs'

// Pictures a motif is made from. The type is read from the bytes (magic numbers), never
// from the file name or the declared content type; the size in pixels is read from the
// header before anything is decoded, so a small file claiming a huge picture costs nothing.
// Decoding happens in a worker thread (server/pictures/), one picture at a time per user.
//
// Answers: 400 a form field or the file is missing; 413 the file is over 5 MB;
// 415 not PNG, JPEG or WebP; 422 the file is damaged, the picture is over 4096 pixels a side
// or 4 megapixels, or it took too long to read; 429 the user already has pictures waiting;
// 503 the server has too many pictures waiting or cannot start a decoder.

export type { PictureType }
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
    throw createError({
      statusCode: 422,
      message: `The picture is ${width} × ${height} pixels; at most ${PICTURE_UPLOAD.maxSide} × ${PICTURE_UPLOAD.maxSide} is accepted`,
    })
  }
  if (width * height > PICTURE_UPLOAD.maxPixels) {
    const count = (n: number) => n.toLocaleString('en-GB')
    const side = Math.floor(Math.sqrt(PICTURE_UPLOAD.maxPixels))
    throw createError({
      statusCode: 422,
      message:
        `The picture is ${width} × ${height} pixels, ${count(width * height)} in all; at most ${count(PICTURE_UPLOAD.maxPixels)} `
        + `(${PICTURE_UPLOAD.maxPixels / 1e6} megapixels, ${side} × ${side} for example) are accepted, plenty for the largest chart: make it smaller and try again`,
    })
  }
  return { bytes, ...sniffed }
}

/**
 * The chart a picture makes with the form's size, threshold and invert, made in a worker
 * thread when it is `userId`'s turn (server/pictures/decodePool.ts).
 */
export async function pictureChart(
  event: H3Event,
  userId: number,
  picture: PictureUpload,
  fields: Pick<PicturePreviewFields, 'width' | 'height' | 'threshold' | 'invert'>,
) {
  const target = { width: fields.width, height: fields.height, threshold: fields.threshold, invert: fields.invert }
  const job = { bytes: picture.bytes, type: picture.type, width: picture.width, height: picture.height, target }
  try {
    return await decodeQueue.run(String(userId), () => chartInWorker(job, Number(useRuntimeConfig().pictureDecodeTimeoutMs)))
  }
  catch (e) {
    throw pictureChartError(event, e)
  }
}

/** What a failure to make the chart answers. */
function pictureChartError(event: H3Event, e: unknown) {
  if (e instanceof DecodeRefusal) {
    return e.answer.kind === 'refused' ? fieldError(e.answer.field, e.answer.message) : corrupt(e.answer.message)
  }
  if (e instanceof DecodeTimeoutError) {
    return createError({ statusCode: 422, message: `The picture took too long to read and was stopped (${e.message}): try a smaller or simpler picture` })
  }
  if (e instanceof QueueFullError) {
    setResponseHeader(event, 'Retry-After', e.whose === 'user' ? 2 : 5)
    return e.whose === 'user'
      ? createError({
          statusCode: 429,
          message: `You already have ${decodeQueue.perUser} pictures being read or waiting to be; wait for them to finish, then try again`,
        })
      : createError({ statusCode: 503, message: 'The server is reading many pictures just now; try again in a few seconds' })
  }
  if (e instanceof DecoderFailedError) {
    // Stopping part-way is the picture's doing (e.g. over the worker's memory limit); not
    // starting at all is ours.
    if (e.started) return corrupt(`the decoder stopped on it (${e.message})`)
    console.error('[pictures] the decoder worker did not start:', e.message)
    setResponseHeader(event, 'Retry-After', 30)
    return createError({ statusCode: 503, message: 'Pictures cannot be read just now; try again later' })
  }
  return e
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
export async function insertPictureMotif(
  draft: Pick<Motif, 'studioId' | 'name' | 'published' | 'createdBy' | 'updatedBy'> & ReturnType<typeof chartRecord>,
  picture: PictureUpload,
): Promise<number> {
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
    if (stored)
      await removePicture(stored).catch(() => {
        /* nothing was stored */
      })
    throw e
  }
}
