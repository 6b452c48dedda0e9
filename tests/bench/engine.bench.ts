// Engine speed check. A plain vitest file, run by `npm run bench` (vitest project
// `bench`). It prints a table and never asserts on time: the goal is each step
// within 10× of a baseline that only reads every knitted cell once.

import { expect, it } from 'vitest'
import { analyseFloats, chartFromRows, chooseCatchNeedles, compilePlan, estimateRowsYarn, estimateYarn, punchCard, shapedNeedles, shapePiece } from '#shared/engine'
import type { Chart, KnittedRow } from '#shared/engine'

const NEEDLES = 200
const ROWS = 2000
const OFFSET = 5

// A 24-stitch, 40-row motif with realistic floats: peeries, a diamond band and
// a wide band with floats of up to 7 stitches.
const motifRows = [
  '........................',
  'x...x...x...x...x...x...',
  '.x.x.x.x.x.x.x.x.x.x.x.x',
  'x...x...x...x...x...x...',
  '........................',
  '...........xx...........',
  '..........xxxx..........',
  '.........xx..xx.........',
  '........xx....xx........',
  '.......xx......xx.......',
  '......xx...xx...xx......',
  '.....xx...xxxx...xx.....',
  '....xx...xx..xx...xx....',
  '...xx...xx....xx...xx...',
  '..xx...xx......xx...xx..',
  '...xx...xx....xx...xx...',
  '....xx...xx..xx...xx....',
  '.....xx...xxxx...xx.....',
  '......xx...xx...xx......',
  '.......xx......xx.......',
  '........xx....xx........',
  '.........xx..xx.........',
  '..........xxxx..........',
  '...........xx...........',
  'xxxxxxxxxxxxxxxxxxxxxxxx',
  '...x.......x.......x....',
  '..xxx.....xxx.....xxx...',
  '.xx.xx...xx.xx...xx.xx..',
  'xx...xx.xx...xx.xx...xx.',
  '.xx.xx...xx.xx...xx.xx..',
  '..xxx.....xxx.....xxx...',
  '...x.......x.......x....',
  'xxxxxxxxxxxxxxxxxxxxxxxx',
  'x.......x.......x.......',
  '.x.....x.x.....x.x.....x',
  '..x...x...x...x...x...x.',
  '...x.x.....x.x.....x.x..',
  '....x.......x.......x...',
  '........................',
  'xx..xx..xx..xx..xx..xx..',
]
const motif = chartFromRows(motifRows)
const tall: Chart = chartFromRows(Array.from({ length: ROWS }, (_, r) => motifRows[r % motifRows.length]!))

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const m = s.length >> 1
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2
}

let sink = 0
function time(fn: () => unknown, runs = 21, warmup = 7): number {
  for (let i = 0; i < warmup; i++) fn()
  const ms: number[] = []
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    const out = fn()
    ms.push(performance.now() - t)
    sink += out ? 1 : 0
  }
  return median(ms)
}

// Reads every cell of the 200 × 2000 knitted area once, same indexing.
function baseline(): number {
  const { width, cells } = tall
  let sum = 0
  for (let r = 0; r < ROWS; r++) {
    const base = r * width
    for (let i = 0; i < NEEDLES; i++) sum += cells[base + ((OFFSET + i) % width)]!
  }
  return sum
}

const plan = (technique: 'together' | 'colour-by-colour') => ({
  technique,
  sections: [
    { kind: 'plain' as const, rows: 30, yarn: 'navy' },
    { kind: 'motif' as const, chart: motif, chartRows: ROWS, main: 'navy', contrast: 'cream' },
    { kind: 'plain' as const, rows: 30, yarn: 'navy' },
  ],
})

// A body about 200 stitches wide and 2000 rows high at 30 × 40 per 10 cm (long, to be measured
// row by row against the same area): side shaping, armholes, stepped shoulders, a round neck.
const tallBody = {
  kind: 'body' as const, hemWidth: 62, width: 66, lengthToUnderarm: 440,
  armhole: { castOff: 2, decrease: 2, depth: 60 }, shoulder: { width: 16, drop: 2, method: 'cast-off' as const }, neck: { width: 16, depth: 10, shape: 'round' as const },
}
const gauge30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }

it('engine speed: 24-stitch motif, 200 needles × 2000 rows', () => {
  const placement = { needles: NEEDLES, offset: OFFSET }
  // Every row of the motif at the full width, as estimateRowsYarn counts a shaped piece's rows.
  const knitted: KnittedRow[] = compilePlan(plan('together')).rows.map(r => ({
    knitFrom: 0, knitTo: NEEDLES, yarns: r.yarns, chart: r.chartRow === null ? undefined : motif, chartRow: r.chartRow ?? undefined, offset: OFFSET,
  }))
  const base = time(baseline)
  const results = [
    ['baseline: read every cell', base],
    ['analyseFloats', time(() => analyseFloats(tall, placement, { limit: 5, stitchWidthMm: 4.5 }))],
    ['chooseCatchNeedles (limit 5)', time(() => chooseCatchNeedles(tall, placement, 5))],
    ['compilePlan together', time(() => compilePlan(plan('together')))],
    ['compilePlan colour-by-colour', time(() => compilePlan(plan('colour-by-colour')))],
    ['estimateYarn colour-by-colour', time(() => estimateYarn({
      plan: plan('colour-by-colour'), placement, swatch: { stitches: 10000, grams: 70 }, needlePitchMm: 4.5,
      yarns: { navy: { metresPer100g: 400 }, cream: { metresPer100g: 400 } },
    }))],
    ['estimateRowsYarn (row by row, together)', time(() => estimateRowsYarn({
      rows: knitted, swatch: { stitches: 10000, grams: 70 }, needlePitchMm: 4.5, yarns: { navy: { metresPer100g: 400 }, cream: { metresPer100g: 400 } },
    }))],
    ['shapePiece + shapedNeedles (~2000 rows)', time(() => shapedNeedles(shapePiece(tallBody, gauge30x40)))],
    ['punchCard (24 wide, 2000 rows)', time(() => punchCard(motif, { width: 24, minRows: ROWS, joinRows: 2 }))],
  ] as const
  const table = results.map(([name, ms]) => ({ name, 'median ms': Number(ms.toFixed(3)), 'ratio to baseline': Number((ms / base).toFixed(2)) }))
  console.log(`\nengine bench (${NEEDLES} needles × ${ROWS} rows, 24-stitch repeat; median of 21 runs after 7 warm-up)`)
  console.table(table)
  // Sanity only, never time.
  expect(analyseFloats(tall, placement).verdict).toBe('long')
  expect(sink).toBeGreaterThan(0)
})
