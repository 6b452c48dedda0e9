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

/**
 * Compile a piece's timeline into machine rows (compilePlan's result: rows and yarn changes).
 * A shaped piece's sections compile to its fabric rows, which are then knitted in the shape's
 * order: each machine row of the shape knits the fabric row it names, so the left of the neck
 * knits the same yarns and chart rows as the right did at that height.
 */
export function compilePieceTimeline(t: PieceTimeline): CompiledPlan {
  const fabric = compilePlan(pieceTimelinePlan(t))
  return t.shape ? knitInShapeOrder(fabric, t) : fabric
}

function knitInShapeOrder(fabric: CompiledPlan, t: PieceTimeline): CompiledPlan {
  const shape = t.shape!
  if (t.technique !== 'together') {
    throw new KnittingInputError('shape: a shaped piece is knitted with both yarns in one pass (technique "together")', { field: 'technique' })
  }
  const height = shape.rows.reduce((n, r) => Math.max(n, r.row + 1), 0)
  if (fabric.rows.length !== height) {
    throw new KnittingInputError(`sections: ${fabric.rows.length} rows, the shaped piece is ${height} rows high`, { field: 'sections' })
  }
  let run = -1
  let count = 0
  const rows = shape.rows.map((r, i) => {
    const f = fabric.rows[r.row]!
    // rowInSection counts on within one stretch of a section; the left part starts it again.
    count = i > 0 && f.section === run && shape.rows[i - 1]!.part === r.part ? count + 1 : 0
    run = f.section
    return { ...f, rowInSection: count }
  })
  const changes: number[] = []
  for (let r = 1; r < rows.length; r++) {
    const a = rows[r]!.yarns
    const b = rows[r - 1]!.yarns
    if (a.length !== b.length || a.some((y, k) => y !== b[k])) changes.push(r)
  }
  return { rows, changes }
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
