// A plan piece (target size + ordered sections) → the engine's numbers and the PieceTimeline a
// project freezes. Pure: the server answers with it and the app may run it offline.
//
// Declared conversions:
// - Needles in work: stitchesForWidth(target width + ease) on the swatch gauge; they stay the
//   cast-on count for the whole timeline (shaping is an instruction, not a change of width in
//   the compiled rows, the float check or the yarn estimate).
// - A section given as lengthCm becomes rowsForLength(lengthCm) rows (a motif: chart rows;
//   colour-by-colour still knits one fabric row per chart row).
// - Shaping: `rows` plain rows in the yarn of the section before (slot 'A' at the start), with
//   spreadShaping(stitchesEachSide, rows) written as the section's note. No yarn changes.
// - Notes (cast on, setting change, cast off) take no rows: their text becomes the note of the
//   next section with rows, or of the last one when nothing follows.

import {
  analyseFloats, centredOffset, chartFromRows, chartToRows, describeShaping, KnittingInputError, repeatsAcross, rowsForLength, spreadShaping, stitchesForWidth,
} from '#shared/engine'
import { slotSymbols, type PieceSection, type PieceTimeline, type SlotYarn, type TimelineCard } from '#shared/piece/types'
import type { PieceShapeNumbers, PlanPieceInput, PlanSectionNumbers } from '#shared/types/plan'
import type { SectionShaping, Chart, Gauge } from '#shared/engine'
import { compilePieceTimeline } from '#shared/piece/timeline'

/** `name` is null for a draft whose name the viewer may not see (a knitter: drafts stay in the library). */
export interface PlanMotif { name: string | null; chart: string[] }

/**
 * What a motif section is called at the machine: the motif's name, or for a hidden draft the
 * section's own label (words the designer put in the published plan) or else just "Motif".
 */
export function motifSectionName(section: { label?: string }, motif: PlanMotif | undefined): string {
  return motif?.name ?? (section.label || 'Motif')
}

export interface PlanPieceContext {
  gauge: Gauge
  technique: PieceTimeline['technique']
  passesPerColour: number
  /** Slot letter → yarn shown at the machine. */
  yarns: { slot: string; name: string; hex: string }[]
  motifs: Map<number, PlanMotif>
  floatLimit: number
  /** The machine's punch card, kept in the timeline for the knit view (timelineCard). */
  card?: TimelineCard
}

export interface WorkedPlanPiece {
  needles: number
  targetRows: number
  plannedRows: number
  timeline: PieceTimeline
  /** Motif offset for each timeline section (0 for plain ones), for the yarn estimate. */
  offsets: number[]
  /** Shaping of each timeline section (null when it keeps its width), for the piece's picture. */
  shaping: (SectionShaping | null)[]
  sections: PlanSectionNumbers[]
  machineRows: number
  colourChanges: number
  /** A shaped piece's counts (null for a rectangle). */
  shape: PieceShapeNumbers | null
}

export const lengthInCm = (value: number, unit: 'cm' | 'in') => (unit === 'in' ? value * 2.54 : value)

/** Slot letter → symbol by the letter's place (A ●, B ▲ …), so a symbol never moves with the list. */
export function planSlotYarns(yarns: { slot: string; name: string; hex: string }[]): SlotYarn[] {
  return [...yarns].sort((a, b) => a.slot.localeCompare(b.slot))
    .map(y => ({ slot: y.slot, name: y.name, hex: y.hex, symbol: slotSymbols[y.slot.charCodeAt(0) - 65] ?? slotSymbols[0] }))
}

/** Works one plan piece out; a bad input throws a KnittingInputError naming `sections[i]…`. */
export function workPlanPiece(piece: PlanPieceInput, ctx: PlanPieceContext): WorkedPlanPiece {
  const needles = stitchesForWidth(lengthInCm(piece.targetWidth + piece.ease, piece.unit), ctx.gauge)
  if (needles < 1) throw new KnittingInputError('targetWidth: the width with ease gives no needles', { field: 'targetWidth' })
  const targetRows = rowsForLength(lengthInCm(piece.targetLength, piece.unit), ctx.gauge)
  const { sections: out, offsets, shaping, numbers } = workSections(piece, needles, ctx)
  const timeline: PieceTimeline = {
    technique: ctx.technique,
    passesPerColour: ctx.technique === 'colour-by-colour' ? ctx.passesPerColour : 1,
    needles,
    sections: out,
    yarns: planSlotYarns(ctx.yarns),
    ...(ctx.card && ctx.technique === 'together' ? { card: ctx.card } : {}),
  }
  const compiled = compilePieceTimeline(timeline)
  return {
    needles, targetRows, plannedRows: numbers.reduce((n, s) => n + s.rows, 0), timeline, offsets, shaping, sections: numbers,
    machineRows: compiled.rows.length, colourChanges: compiled.changes.length, shape: null,
  }
}

export interface WorkedSections {
  sections: PieceSection[]
  /** Motif offset for each timeline section (0 for plain ones). */
  offsets: number[]
  shaping: (SectionShaping | null)[]
  /** One per plan section, notes included. */
  numbers: PlanSectionNumbers[]
}

/**
 * A piece's plan sections → timeline sections on `needles` cast-on needles. A shaped piece
 * (`shaped`) takes its shaping from its measurements, so a shaping section is refused there.
 */
export function workSections(piece: PlanPieceInput, needles: number, ctx: PlanPieceContext, shaped = false): WorkedSections {
  const slots = new Set(ctx.yarns.map(y => y.slot))
  const needSlot = (slot: string, field: string) => {
    if (!slots.has(slot)) throw new KnittingInputError(`${field}: the plan has no yarn in slot ${slot}`, { field })
  }
  const out: PieceSection[] = []
  const offsets: number[] = []
  const shaping: (SectionShaping | null)[] = []
  const numbers: PlanSectionNumbers[] = []
  let pending: string[] = []
  let current = 'A'
  let stitches = needles
  const push = (section: PieceSection, offset = 0, shape: SectionShaping | null = null) => {
    const notes = [...pending, ...(section.note ? [section.note] : [])]
    out.push(notes.length ? { ...section, note: notes.join(' — ') } : section)
    offsets.push(offset)
    shaping.push(shape)
    pending = []
  }
  const none = { placement: null, maxFloat: null, maxFloatMm: null, shaping: null }
  piece.sections.forEach((s, i) => {
    const field = `sections[${i}]`
    if (s.kind === 'plain') {
      needSlot(s.yarn, `${field}.yarn`)
      const rows = s.rows ?? rowsForLength(s.lengthCm!, ctx.gauge)
      if (rows < 1) throw new KnittingInputError(`${field}.lengthCm: too short for one row`, { field: `${field}.lengthCm` })
      push({ kind: 'plain', label: s.label || 'Plain', rows, yarn: s.yarn, note: s.stitchSize ? `Stitch size ${s.stitchSize}` : undefined })
      current = s.yarn
      numbers.push({ kind: s.kind, rows, ...none })
    }
    else if (s.kind === 'motif') {
      needSlot(s.main, `${field}.main`)
      needSlot(s.contrast, `${field}.contrast`)
      const motif = ctx.motifs.get(s.motifId)
      if (!motif) throw new KnittingInputError(`${field}.motifId: no such motif`, { field: `${field}.motifId` })
      const chart: Chart = chartFromRows(motif.chart)
      const rows = s.chartRows ?? rowsForLength(s.lengthCm!, ctx.gauge)
      if (rows < 1) throw new KnittingInputError(`${field}.lengthCm: too short for one row`, { field: `${field}.lengthCm` })
      const offset = s.placement === 'centred' ? centredOffset(needles, chart.width) : s.placement.offset % chart.width
      const floats = analyseFloats(chart, { needles, offset }, { limit: ctx.floatLimit, stitchWidthMm: ctx.gauge.stitchWidthMm })
      const name = motifSectionName(s, motif)
      push({ kind: 'motif', label: s.label || name, motifName: name, chart: chartToRows(chart), chartRows: rows, main: s.main, contrast: s.contrast }, offset)
      current = s.main
      numbers.push({
        kind: s.kind, rows, placement: { offset, chartWidth: chart.width, ...repeatsAcross(needles, chart.width, offset) },
        maxFloat: floats.maxFloat, maxFloatMm: floats.maxFloatMm ?? null, shaping: null,
      })
    }
    else if (s.kind === 'shaping') {
      if (shaped) {
        throw new KnittingInputError(`${field}: a shaped piece takes its shaping from its measurements; remove this shaping section`, { field: `${field}.kind` })
      }
      let steps
      try { steps = spreadShaping(s.stitchesEachSide, s.rows) }
      catch (e) {
        if (e instanceof KnittingInputError) throw new KnittingInputError(`${field}: ${e.message}`, { field: `${field}.stitchesEachSide` })
        throw e
      }
      const text = describeShaping(steps)
      stitches += (s.change === 'increase' ? 2 : -2) * s.stitchesEachSide
      if (stitches < 1) throw new KnittingInputError(`${field}.stitchesEachSide: decreases leave no stitches`, { field: `${field}.stitchesEachSide` })
      const verb = s.change === 'increase' ? 'Increase' : 'Decrease'
      push(
        { kind: 'plain', label: s.label || `${verb}s`, rows: s.rows, yarn: current, note: `${verb} 1 stitch each side ${text} (${stitches} stitches after)` },
        0,
        { change: s.change, steps },
      )
      numbers.push({ kind: s.kind, rows: s.rows, ...none, shaping: { steps, text, stitchesAfter: stitches } })
    }
    else {
      pending.push(s.text)
      numbers.push({ kind: s.kind, rows: 0, ...none })
    }
  })
  if (out.length === 0) throw new KnittingInputError('sections: at least one section with rows is needed', { field: 'sections' })
  if (pending.length) {
    const last = out[out.length - 1]!
    out[out.length - 1] = { ...last, note: [last.note, ...pending].filter(Boolean).join(' — ') }
  }
  return { sections: out, offsets, shaping, numbers }
}
