// A shaped plan piece (measurements → shapePiece) worked out for one size: the timeline a
// project freezes and the numbers the planner shows. Pure, like workPlanPiece.
//
// Declared model:
// - The cast-on is the shape's; the motif is placed on it (centred on the cast-on's middle, which
//   the symmetric shaping keeps at the machine's centre) and stays fixed to the bed as the edges
//   move (shapedNeedles).
// - The sections give the fabric rows from the cast-on up. Fewer rows than the piece is high:
//   the rest is plain in slot 'A' ("Plain to the top"); more: they are cut at the top.
// - A motif section's longest float is the longest over the rows it is knitted on, each row at
//   the needles that knit it (held needles out), measured like analyseFloats.

import { analyseFloats, chartFromRows, KnittingInputError, shapedNeedles, shapePiece } from '#shared/engine'
import type { Chart, CompiledPlan, Gauge, KnittedRow, RowFloats, RowNeedles, ShapedPiece, ShapeSpec } from '#shared/engine'
import { compilePieceTimeline } from '#shared/piece/timeline'
import type { PieceSection, PieceTimeline } from '#shared/piece/types'
import type { PieceShape, PieceShapeNumbers, PieceSizeCounts, PlanPieceInput } from '#shared/types/plan'
import { planSlotYarns, workSections, type PlanPieceContext, type WorkedPlanPiece } from './planPiece'
import { sizedShapeSpec } from './sizes'

const mod = (n: number, w: number) => ((n % w) + w) % w

/** Sections cut or topped up to `height` fabric rows. */
function fitSections(sections: PieceSection[], offsets: number[], height: number) {
  const rowsOf = (s: PieceSection) => (s.kind === 'plain' ? s.rows : s.chartRows)
  const out: PieceSection[] = []
  const outOffsets: number[] = []
  let at = 0
  sections.forEach((s, i) => {
    if (at >= height) return
    const rows = Math.min(rowsOf(s), height - at)
    out.push(s.kind === 'plain' ? { ...s, rows } : { ...s, chartRows: rows })
    outOffsets.push(offsets[i]!)
    at += rows
  })
  if (at < height) {
    out.push({ kind: 'plain', label: 'Plain to the top', rows: height - at, yarn: 'A' })
    outOffsets.push(0)
  }
  return { sections: out, offsets: outOffsets }
}

/** Each machine row of a shaped timeline as the yarn estimate counts it. */
export function shapedKnittedRows(timeline: PieceTimeline, compiled: CompiledPlan, offsets: number[], needles?: RowNeedles[]): KnittedRow[] {
  if (!timeline.shape) throw new KnittingInputError('shape: the piece is not shaped', { field: 'shape' })
  const spans = needles ?? shapedNeedles(timeline.shape)
  const charts = new Map<number, Chart>()
  return compiled.rows.map((r, i) => {
    const n = spans[i]!
    const s = timeline.sections[r.section]!
    if (s.kind === 'plain' || r.chartRow === null) return { knitFrom: n.knitFrom, knitTo: n.knitTo, yarns: r.yarns }
    let chart = charts.get(r.section)
    if (!chart) charts.set(r.section, (chart = chartFromRows(s.chart)))
    return { knitFrom: n.knitFrom, knitTo: n.knitTo, yarns: r.yarns, chart, chartRow: r.chartRow, offset: offsets[r.section] }
  })
}

/** Works a shaped piece out for one size; a bad spec throws a KnittingInputError naming `shape.…`. */
export function workShapedPiece(piece: PlanPieceInput, spec: ShapeSpec, size: string, ctx: PlanPieceContext): WorkedPlanPiece {
  if (ctx.technique !== 'together') {
    throw new KnittingInputError('shape: shaped pieces are knitted with both yarns in one pass; this machine feeds the colours one by one', { field: 'shape' })
  }
  let shaped
  try { shaped = shapePiece(spec, ctx.gauge) }
  catch (e) {
    if (!(e instanceof KnittingInputError)) throw e
    throw new KnittingInputError(`shape.${e.message}`, { field: `shape.${e.field ?? ''}` })
  }
  const castOn = shaped.castOn
  const worked = workSections(piece, castOn, ctx, true)
  const height = shaped.rows.reduce((n, r) => Math.max(n, r.row + 1), 0)
  const sectionRows = worked.sections.reduce((n, s) => n + (s.kind === 'plain' ? s.rows : s.chartRows), 0)
  const fitted = fitSections(worked.sections, worked.offsets, height)
  const timeline: PieceTimeline = {
    technique: 'together',
    passesPerColour: 1,
    needles: castOn,
    sections: fitted.sections,
    yarns: planSlotYarns(ctx.yarns),
    shape: { size, kind: spec.kind, castOn, rows: shaped.rows, leftOnNeedles: shaped.leftOnNeedles },
    ...(ctx.card ? { card: ctx.card } : {}),
  }
  const compiled = compilePieceTimeline(timeline)
  const needles = shapedNeedles(timeline.shape!)

  // Floats at the real width: one analysis per stretch of needles (width, first column) a motif section meets.
  const analyses = new Map<string, RowFloats[]>()
  const charts = new Map<number, Chart>()
  const longest = new Map<number, [number, number]>() // timeline section → longest per yarn
  compiled.rows.forEach((r, i) => {
    const s = timeline.sections[r.section]!
    const n = needles[i]!
    if (s.kind !== 'motif' || r.chartRow === null || n.knitTo <= n.knitFrom) return
    let chart = charts.get(r.section)
    if (!chart) charts.set(r.section, (chart = chartFromRows(s.chart)))
    const offset = mod(fitted.offsets[r.section]! + n.knitFrom, chart.width)
    const key = `${r.section}:${n.knitTo - n.knitFrom}:${offset}`
    let rows = analyses.get(key)
    if (!rows) analyses.set(key, (rows = analyseFloats(chart, { needles: n.knitTo - n.knitFrom, offset }, { limit: ctx.floatLimit }).rows))
    const f = rows[r.chartRow]!.maxFloat
    const best = longest.get(r.section) ?? [0, 0]
    longest.set(r.section, [Math.max(best[0], f[0]), Math.max(best[1], f[1])])
  })
  // Plan sections with rows are the timeline's sections in order (notes take none).
  const withRows = worked.numbers.flatMap((n, j) => (n.kind === 'plain' || n.kind === 'motif' ? [j] : []))
  const numbers = worked.numbers.map((n, j) => {
    const ti = withRows.indexOf(j)
    if (n.kind !== 'motif') return n
    const f = longest.get(ti) ?? [0, 0]
    return { ...n, maxFloat: f, maxFloatMm: [f[0] * ctx.gauge.stitchWidthMm, f[1] * ctx.gauge.stitchWidthMm] as [number, number] }
  })

  const shape: PieceShapeNumbers = { ...sizeCounts(shaped, size, needles), sectionRows }
  return {
    needles: castOn,
    targetRows: height,
    plannedRows: sectionRows,
    timeline,
    offsets: fitted.offsets,
    shaping: fitted.sections.map(() => null),
    sections: numbers,
    machineRows: compiled.rows.length,
    colourChanges: compiled.changes.length,
    shape,
  }
}

function sizeCounts(shaped: ShapedPiece, size: string, needles = shapedNeedles(shaped)): PieceSizeCounts {
  const from = Math.min(...needles.map(n => n.from))
  const to = Math.max(...needles.map(n => n.to))
  return {
    size, castOn: shaped.castOn, height: shaped.rows.reduce((n, r) => Math.max(n, r.row + 1), 0), machineRows: shaped.rows.length,
    widest: to - from, counts: shaped.counts,
  }
}

/** The shape's counts in every size (cheap: no sections, no floats); a size the shape refuses says why. */
export function shapeSizeCounts(shape: PieceShape, sizes: string[], unit: 'cm' | 'in', gauge: Gauge): (PieceSizeCounts | { size: string; error: string })[] {
  return sizes.map((size, index) => {
    try { return sizeCounts(shapePiece(sizedShapeSpec(shape, index, unit), gauge), size) }
    catch (e) {
      if (!(e instanceof KnittingInputError)) throw e
      return { size, error: e.message }
    }
  })
}
