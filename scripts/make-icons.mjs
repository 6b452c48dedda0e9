#!/usr/bin/env node
// Draws the app icons (our mark: a row of stitches with a float behind it) as PNGs in
// public/icons/. Run again after changing the mark: `node scripts/make-icons.mjs`.
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { PNG } from 'pngjs'

const out = join(dirname(fileURLToPath(import.meta.url)), '../public/icons')
const loch = [31, 78, 95], oat = [247, 244, 238], heather = [201, 163, 189]

function draw(size, { maskable = false } = {}) {
  const png = new PNG({ width: size, height: size })
  const pad = maskable ? 0 : size * 0.04
  const radius = maskable ? 0 : size * 0.22
  // Wave (a strand of yarn) and a dotted float line, in a 32-unit design space.
  const u = (size - 2 * pad) / 32
  const inset = maskable ? 0.18 : 0 // keep the mark inside a maskable icon's safe zone
  const scale = 1 - 2 * inset
  const wave = Array.from({ length: 200 }, (_, i) => {
    const x = 6 + (20 * i) / 199
    return [x, 12 - 2.2 * Math.sin(((x - 6) / 8) * Math.PI)]
  })
  const dots = Array.from({ length: 5 }, (_, i) => [7 + i * 4.5, 21.5])
  for (let y = 0; y < size; y++) {
    for (let x = 0; x < size; x++) {
      const i = (y * size + x) * 4
      // Rounded-square background.
      const cx = Math.max(pad + radius - x, 0, x - (size - pad - radius))
      const cy = Math.max(pad + radius - y, 0, y - (size - pad - radius))
      const inside = x >= pad && x < size - pad && y >= pad && y < size - pad && (radius === 0 || cx * cx + cy * cy <= radius * radius)
      let colour = inside ? loch : null
      if (inside) {
        const dx = ((x - pad) / u - 16) / scale + 16, dy = ((y - pad) / u - 16) / scale + 16
        if (wave.some(([wx, wy]) => (wx - dx) ** 2 + (wy - dy) ** 2 < 1.4 ** 2)) colour = oat
        else if (dots.some(([px, py]) => (px - dx) ** 2 + (py - dy) ** 2 < 1.3 ** 2)) colour = heather
      }
      png.data[i] = colour?.[0] ?? 0
      png.data[i + 1] = colour?.[1] ?? 0
      png.data[i + 2] = colour?.[2] ?? 0
      png.data[i + 3] = colour ? 255 : 0
    }
  }
  return PNG.sync.write(png)
}

mkdirSync(out, { recursive: true })
for (const [name, size, opts] of [
  ['icon-192.png', 192],
  ['icon-512.png', 512],
  ['maskable-512.png', 512, { maskable: true }],
  ['apple-touch-icon.png', 180, { maskable: true }],
]) {
  writeFileSync(join(out, name), draw(size, opts))
  console.log(`public/icons/${name}`)
}
writeFileSync(join(out, '../favicon.png'), draw(48))
console.log('public/favicon.png')
