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
