// A piece's timeline (as stored and shown) → the engine's plan input and its compiled rows.
// Yarn ids in the compiled plan are the slot letters ('A', 'B' …).

import { chartFromRows, chartToRows, compilePlan, KnittingInputError } from '#shared/engine'
import type { CompiledPlan, PlanInput, PlanSection } from '#shared/engine'
import { slotSymbols, type PieceSection, type PieceTimeline, type SlotYarn } from '#shared/piece/types'

/**
 * The engine's plan input for a piece. Charts are read with chartFromRows; a bad chart or a
 * section naming a slot with no yarn throws a KnittingInputError whose field is `sections[i]…`.
 */
export function pieceTimelinePlan(t: PieceTimeline): PlanInput {
  const slots = new Set(t.yarns.map(y => y.slot))
  const needSlot = (slot: string, field: string) => {
    if (!slots.has(slot)) throw new KnittingInputError(`${field}: no yarn in slot ${JSON.stringify(slot)}`, { field })
  }
  const sections = t.sections.map((s, i): PlanSection => {
    const field = `sections[${i}]`
    if (s.kind === 'plain') {
      needSlot(s.yarn, `${field}.yarn`)
      return { kind: 'plain', rows: s.rows, yarn: s.yarn }
    }
    needSlot(s.main, `${field}.main`)
    needSlot(s.contrast, `${field}.contrast`)
    let chart
    try { chart = chartFromRows(s.chart) }
    catch (e) {
      if (!(e instanceof KnittingInputError)) throw e
      throw new KnittingInputError(`${field}.${e.message}`, { field: `${field}.chart`, row: e.row, col: e.col })
    }
    return { kind: 'motif', chart, chartRows: s.chartRows, main: s.main, contrast: s.contrast }
  })
  return { technique: t.technique, passesPerColour: t.technique === 'colour-by-colour' ? t.passesPerColour : undefined, sections }
}

/** Compile a piece's timeline into machine rows (compilePlan's result: rows and yarn changes). */
export function compilePieceTimeline(t: PieceTimeline): CompiledPlan {
  return compilePlan(pieceTimelinePlan(t))
}

/** Slot letters and symbols for yarns in order: the first is 'A', the main colour. */
export function slotYarns(yarns: { name: string; hex: string }[]): SlotYarn[] {
  if (yarns.length > slotSymbols.length) {
    throw new KnittingInputError(`yarns: at most ${slotSymbols.length} yarns in one piece`, { field: 'yarns' })
  }
  return yarns.map((y, i) => ({ slot: String.fromCharCode(65 + i), name: y.name, hex: y.hex, symbol: slotSymbols[i]! }))
}

export interface BorderedMotifInput {
  technique: PieceTimeline['technique']
  passesPerColour?: number
  needles: number
  /** Main colour first ('A'), then contrast ('B'). */
  yarns: SlotYarn[]
  motif: { name: string; chart: string[] }
  chartRows: number
  borderBefore: number
  borderAfter: number
  labels?: { before?: string; after?: string }
}

/**
 * The simplest piece: a plain border in the main colour, the motif for `chartRows` chart rows
 * (repeating when that is more than its height), a plain border. A border of 0 rows is left out.
 */
export function borderedMotifTimeline(input: BorderedMotifInput): PieceTimeline {
  const [main, contrast] = input.yarns
  if (!main || !contrast) throw new KnittingInputError('yarns: a main and a contrast yarn are needed', { field: 'yarns' })
  const chart = chartToRows(chartFromRows(input.motif.chart))
  const sections: PieceSection[] = []
  if (input.borderBefore > 0) sections.push({ kind: 'plain', label: input.labels?.before ?? 'Lower border', rows: input.borderBefore, yarn: main.slot })
  sections.push({
    kind: 'motif',
    label: input.motif.name,
    motifName: input.motif.name,
    chart,
    chartRows: input.chartRows,
    main: main.slot,
    contrast: contrast.slot,
  })
  if (input.borderAfter > 0) sections.push({ kind: 'plain', label: input.labels?.after ?? 'Upper border', rows: input.borderAfter, yarn: main.slot })
  return {
    technique: input.technique,
    passesPerColour: input.technique === 'colour-by-colour' ? (input.passesPerColour ?? 2) : 1,
    needles: input.needles,
    sections,
    yarns: input.yarns,
  }
}
