import { crc32, deflateSync } from 'node:zlib'
import jpeg from 'jpeg-js'
import { PNG } from 'pngjs'

type Rgba = [number, number, number, number]

/** A PNG made in the test: `pixel(x, y)` (y from the top) gives each pixel's RGBA. */
export function pngOf(width: number, height: number, pixel: (x: number, y: number) => Rgba): Buffer {
  const png = new PNG({ width, height })
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) png.data.set(pixel(x, y), (y * width + x) * 4)
  }
  return PNG.sync.write(png)
}

/** A JPEG made in the test (lossy: use blocks of flat colour). */
export function jpegOf(width: number, height: number, pixel: (x: number, y: number) => Rgba): Buffer {
  const data = Buffer.alloc(width * height * 4)
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) data.set(pixel(x, y), (y * width + x) * 4)
  }
  return jpeg.encode({ data, width, height }, 95).data
}

/**
 * A picture of a chart drawn the way charts are read: `rows[0]` is the first row knitted,
 * so it is the bottom band of the picture; 'x' cells black, '.' cells white, each cell
 * `cell` × `cell` pixels.
 */
export function chartPicture(rows: string[], cell = 10, encode: typeof pngOf = pngOf): Buffer {
  const width = rows[0]!.length
  const height = rows.length
  return encode(width * cell, height * cell, (x, y) => {
    const row = rows[height - 1 - Math.floor(y / cell)]!
    return row[Math.floor(x / cell)] === 'x' ? [0, 0, 0, 255] : [255, 255, 255, 255]
  })
}

/** The multipart form of the picture routes. */
export function pictureForm(fields: Record<string, string | number | boolean>, picture?: Uint8Array, filename = 'picture.png', type = 'image/png') {
  const form = new FormData()
  for (const [key, value] of Object.entries(fields)) form.append(key, String(value))
  if (picture) form.append('picture', new Blob([new Uint8Array(picture)], { type }), filename)
  return form
}

/**
 * A lossless WebP of `width` × `height` transparent black pixels in about 30 bytes: every
 * prefix code has a single symbol, so each pixel takes no bits at all and the decoder still
 * writes width × height × 4 bytes. (VP8L bitstream: signature, 14-bit sizes, no transform,
 * no colour cache, no meta prefix codes, five "simple" one-symbol codes for symbol 0.)
 */
export function webpBomb(width: number, height: number): Buffer {
  const bits: number[] = []
  const put = (value: number, count: number) => { for (let i = 0; i < count; i++) bits.push((value >>> i) & 1) }
  put(0x2F, 8)
  put(width - 1, 14)
  put(height - 1, 14)
  put(0, 1 + 3) // alpha hint, version 0
  put(0, 3) // no transform, no colour cache, no meta prefix codes
  for (let code = 0; code < 5; code++) put(0b0001, 4) // simple code, one symbol, 1-bit symbol 0
  const payload = Buffer.alloc(Math.ceil(bits.length / 8) + 2) // padded: an even chunk of at least 10 bytes
  bits.forEach((bit, i) => { payload[i >> 3]! |= bit << (i & 7) })
  const header = Buffer.alloc(20)
  header.write('RIFF', 0, 'latin1')
  header.writeUInt32LE(12 + payload.length, 4)
  header.write('WEBPVP8L', 8, 'latin1')
  header.writeUInt32LE(payload.length, 16)
  return Buffer.concat([header, payload])
}

/**
 * A PNG of `width` × `height` black, transparent pixels: all zeros, deflated about 1000 : 1.
 * 16 bits a channel and the Paeth filter on every row make it the slowest kind to decode
 * (pngjs takes several times as long as for 8 bits unfiltered).
 */
export function pngBomb(width: number, height: number, { bitDepth = 8, paeth = false }: { bitDepth?: 8 | 16; paeth?: boolean } = {}): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data])
    const framed = Buffer.alloc(body.length + 8)
    framed.writeUInt32BE(data.length, 0)
    body.copy(framed, 4)
    framed.writeUInt32BE(crc32(body), body.length + 4)
    return framed
  }
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(width, 0)
  ihdr.writeUInt32BE(height, 4)
  ihdr[8] = bitDepth
  ihdr[9] = 6 // RGBA
  const rowBytes = 1 + width * 4 * bitDepth / 8
  const scanlines = Buffer.alloc(height * rowBytes) // a filter byte, then zero pixels, every row
  if (paeth) for (let y = 0; y < height; y++) scanlines[y * rowBytes] = 4
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]),
    chunk('IHDR', ihdr), chunk('IDAT', deflateSync(scanlines, { level: 9 })), chunk('IEND', Buffer.alloc(0)),
  ])
}
