// Yarn per colour from a weighed swatch plus float length.
//
// Declared model (knitting handbooks for the weighing; floats common practice):
// - Every knitted stitch weighs what a swatch stitch weighs:
//   grams per stitch = swatch grams / swatch stitches (stitches × rows knitted).
// - Plain rows: the row's yarn knits every needle in work.
// - Motif rows: needle i knits chart column (offset + i) mod width. A yarn
//   knits the needles of its colour and floats behind every other needle in
//   work; each needle floated past adds one needle pitch of yarn. A row where a
//   yarn knits nothing still counts a full-width float (the yarn travels with
//   the carriage) — generous if the knitter cuts it instead.
// - 'together': one pass per chart row, both yarns as above.
//   'colour-by-colour': each of the passesPerColour passes of a yarn knits that
//   yarn's stitches and floats past the others, so a chart row costs each yarn
//   passesPerColour times its stitches and floats.
// - Float length becomes grams through the yarn's metres per 100 g; metres
//   are the total grams at that grist.

import { assertChart } from './chart'
import { KnittingInputError } from './errors'
import { checkPlacement, needleColumns } from './placement'
import type { PlanInput } from './rows'
import { checkPlan } from './rows'
import type { Chart, Placement } from './types'
import { requireObject, requirePositive } from './validate'

export interface YarnEstimateInput {
  /** The same plan given to compilePlan. */
  plan: PlanInput
  /** Needles in work and the chart column of the leftmost one (for every motif section). */
  placement: Placement
  /** A weighed swatch: total knitted stitches (stitches × rows) and its weight. */
  swatch: { stitches: number; grams: number }
  /** Needle pitch of the machine, mm (standard about 4.5, mid 6.5–7, bulky 9). */
  needlePitchMm: number
  /** Grist of each yarn named in the plan. */
  yarns: Record<string, { metresPer100g: number }>
}

export interface YarnAmount {
  yarn: string
  /** Stitches this yarn knits. */
  stitches: number
  /** Needles this yarn floats past, summed over all rows. */
  floatStitches: number
  /** Float length, mm (floatStitches × needle pitch). */
  floatMm: number
  /** Weight of the knitted stitches alone. */
  stitchGrams: number
  /** Weight of the floats alone. */
  floatGrams: number
  /** Total weight. */
  grams: number
  /** Total length. */
  metres: number
}

export interface YarnEstimate {
  /** One entry per yarn, in order of first use in the plan. */
  yarns: YarnAmount[]
  /** The model, in plain English, for the printed sheet. */
  model: string
}

/** Yarn needed per colour for a plan; see the model above. */
export function estimateYarn(input: YarnEstimateInput): YarnEstimate {
  const inp = requireObject(input, 'estimate')
  const plan = input.plan
  const { passes } = checkPlan(plan)
  const { needles, offset } = checkPlacement(input.placement)
  const swatch = requireObject(inp.swatch, 'swatch')
  const swatchStitches = requirePositive(swatch.stitches, 'swatch.stitches')
  const swatchGrams = requirePositive(swatch.grams, 'swatch.grams')
  const pitch = requirePositive(input.needlePitchMm, 'needlePitchMm')
  const grist = requireObject(inp.yarns, 'yarns')

  const gramsPerStitch = swatchGrams / swatchStitches
  const stitches = new Map<string, number>()
  const floats = new Map<string, number>()
  const add = (yarn: string, st: number, fl: number): void => {
    stitches.set(yarn, (stitches.get(yarn) ?? 0) + st)
    floats.set(yarn, (floats.get(yarn) ?? 0) + fl)
  }

  plan.sections.forEach((s) => {
    if (s.kind === 'plain') {
      add(s.yarn, s.rows * needles, 0)
      return
    }
    const chart = s.chart
    assertChart(chart)
    const { width, height, cells } = chart
    const cols = needleColumns(width, needles, offset)
    const full = Math.floor(s.chartRows / height)
    const extra = s.chartRows % height
    let main = 0 // main-colour stitches over all chart rows knitted, one pass each
    for (let r = 0; r < height; r++) {
      const times = full + (r < extra ? 1 : 0)
      if (times === 0) continue
      const base = r * width
      let contrast = 0
      for (let i = 0; i < needles; i++) contrast += cells[base + cols[i]!]!
      main += (needles - contrast) * times
    }
    const contrastStitches = s.chartRows * needles - main
    add(s.main, main * passes, contrastStitches * passes)
    add(s.contrast, contrastStitches * passes, main * passes)
  })

  const yarns = yarnAmounts(stitches, floats, gramsPerStitch, pitch, grist)

  const model = [
    `Each knitted stitch weighs as much as one swatch stitch (${swatchGrams} g over ${swatchStitches} stitches).`,
    `In patterned rows a yarn floats behind every needle it does not knit, and each needle floated past adds one needle pitch (${pitch} mm) of yarn, weighed by that yarn's metres per 100 g.`,
    plan.technique === 'colour-by-colour'
      ? `Colours are fed one at a time, ${passes} passes each per chart row; every pass knits that colour's stitches and floats past the rest.`
      : 'Both colours are fed together, one pass per chart row.',
    'A row where a yarn knits nothing still counts a full-width float, as the yarn travels with the carriage; cutting it instead saves that yarn.',
  ].join(' ')
  return { yarns, model }
}

/** Grams and metres per yarn from its stitches and float needles (the model above). */
function yarnAmounts(
  stitches: Map<string, number>, floats: Map<string, number>, gramsPerStitch: number, pitch: number, grist: Record<string, unknown>,
): YarnAmount[] {
  const yarns: YarnAmount[] = []
  for (const [yarn, st] of stitches) {
    const g = grist[yarn]
    if (typeof g !== 'object' || g === null) {
      throw new KnittingInputError(`yarns: no metres per 100 g given for yarn ${JSON.stringify(yarn)}`, { field: `yarns.${yarn}` })
    }
    const metresPer100g = requirePositive((g as { metresPer100g: unknown }).metresPer100g, `yarns.${yarn}.metresPer100g`)
    const floatStitches = floats.get(yarn) ?? 0
    const floatMm = floatStitches * pitch
    const stitchGrams = st * gramsPerStitch
    const floatGrams = floatMm / 1000 / metresPer100g * 100
    const grams = stitchGrams + floatGrams
    yarns.push({ yarn, stitches: st, floatStitches, floatMm, stitchGrams, floatGrams, grams, metres: grams * metresPer100g / 100 })
  }

  return yarns
}

/** One row of a shaped piece for estimateRowsYarn: the needles that knit it and what it knits. */
export interface KnittedRow {
  /** Needles knitFrom … knitTo − 1 knit this row (cast-on positions; none when equal). */
  knitFrom: number
  knitTo: number
  /** A plain row: [yarn]; a patterned row, both yarns in one pass: [main, contrast]. */
  yarns: string[]
  /** Patterned rows: the chart, the chart row knitted and the column needle 0 knits. */
  chart?: Chart
  chartRow?: number
  offset?: number
}

export interface RowsYarnInput extends Omit<YarnEstimateInput, 'plan' | 'placement'> {
  rows: KnittedRow[]
}

/**
 * Yarn per colour row by row, each row at its real width (a shaped piece): the same model as
 * estimateYarn with both yarns in one pass — needle n knits chart column (offset + n) mod width,
 * so the motif stays on the bed while the edges move; held needles are not in the row.
 */
export function estimateRowsYarn(input: RowsYarnInput): YarnEstimate {
  const inp = requireObject(input, 'estimate')
  const swatch = requireObject(inp.swatch, 'swatch')
  const swatchStitches = requirePositive(swatch.stitches, 'swatch.stitches')
  const swatchGrams = requirePositive(swatch.grams, 'swatch.grams')
  const pitch = requirePositive(input.needlePitchMm, 'needlePitchMm')
  const grist = requireObject(inp.yarns, 'yarns')
  if (!Array.isArray(input.rows)) throw new KnittingInputError('rows: expected a list of rows', { field: 'rows' })
  const stitches = new Map<string, number>()
  const floats = new Map<string, number>()
  const add = (yarn: string, st: number, fl: number): void => {
    stitches.set(yarn, (stitches.get(yarn) ?? 0) + st)
    floats.set(yarn, (floats.get(yarn) ?? 0) + fl)
  }
  input.rows.forEach((row, i) => {
    const n = Math.max(0, row.knitTo - row.knitFrom)
    const [main, contrast] = row.yarns
    if (!main) throw new KnittingInputError(`rows[${i}].yarns: no yarn`, { field: `rows[${i}].yarns` })
    if (!contrast || !row.chart) {
      add(main, n, 0)
      return
    }
    const { width, cells } = row.chart
    const base = (row.chartRow ?? 0) * width
    let c = 0
    for (let k = row.knitFrom; k < row.knitTo; k++) c += cells[base + ((((row.offset ?? 0) + k) % width) + width) % width]!
    add(main, n - c, c)
    add(contrast, c, n - c)
  })
  const yarns = yarnAmounts(stitches, floats, swatchGrams / swatchStitches, pitch, grist)
  const model = [
    `Each knitted stitch weighs as much as one swatch stitch (${swatchGrams} g over ${swatchStitches} stitches).`,
    'Every row is counted at its real width: the needles that knit it, with needles in holding position and cast-off stitches left out.',
    `In patterned rows a yarn floats behind every needle it does not knit, and each needle floated past adds one needle pitch (${pitch} mm) of yarn, weighed by that yarn's metres per 100 g.`,
    'Both colours are fed together, one pass per chart row.',
  ].join(' ')
  return { yarns, model }
}
