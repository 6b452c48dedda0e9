// Plans, as the API answers with them (machines, yarn and swatches are in ./stock).
// Times are ISO strings (UTC). Lengths carry their unit; engine numbers are unrounded
// unless named as counts (needles, rows, stitches).

import type { Distinguishability, SectionShaping, ShapedPiece } from '#shared/engine'
import type { PieceTimeline } from '#shared/piece/types'
import type { LengthUnit } from './stock'

/** A plan names its yarns by slot letter: 'A' is the main colour, then 'B', 'C' … */
export interface PlanYarnSlot { slot: string; yarnId: number }

/**
 * One section of a plan piece, in knitting order.
 * - plain: `rows` rows, or `lengthCm` turned into rows with the swatch gauge.
 * - motif: `chartRows` chart rows, or `lengthCm` turned into chart rows with the swatch gauge.
 * - shaping: `stitchesEachSide` increases or decreases at each edge, spread over `rows` rows;
 *   those rows are knitted plain in the yarn of the section before (slot 'A' at the start).
 * - notes take no rows: they become the note of the next section with rows (the last one's
 *   when nothing follows).
 */
export type PlanSection
  = | { kind: 'cast-on-note' | 'setting-note' | 'cast-off-note'; text: string }
    | { kind: 'plain'; label?: string; rows?: number; lengthCm?: number; yarn: string; stitchSize?: string }
    | {
      kind: 'motif'
      label?: string
      motifId: number
      placement: 'centred' | { offset: number }
      chartRows?: number
      lengthCm?: number
      main: string
      contrast: string
    }
    | { kind: 'shaping'; label?: string; change: 'increase' | 'decrease'; stitchesEachSide: number; rows: number }

export type PlanSectionKind = PlanSection['kind']

/**
 * The measurements a shaped piece is drawn from: flat lengths of the finished piece, in the
 * piece's unit. Widths are across the whole piece (hemWidth, width, neckWidth, capTopWidth) or
 * one side (armholeCastOff, armholeDecrease, capCastOff, shoulderWidth); lengths run up the piece.
 */
export const shapeMeasurements = [
  'hemWidth', 'width', 'lengthToUnderarm',
  'armholeCastOff', 'armholeDecrease', 'armholeDepth',
  'shoulderWidth', 'shoulderDrop',
  'neckWidth', 'neckDepth',
  'capCastOff', 'capHeight', 'capTopWidth',
] as const
export type ShapeMeasurement = typeof shapeMeasurements[number]

/**
 * A piece shaped from measurements (the engine's shapePiece), for every size of the plan.
 * Which measurements a piece needs follows from its choices: a body with an armhole needs the
 * three armhole ones, a sleeve with a cap the three cap ones, and so on (shared/planner/sizes).
 */
export interface PieceShape {
  kind: 'body' | 'sleeve'
  /** Side of the carriage before the first row after the cast-on, as the knitter facing the machine sees it. */
  carriageStart: 'left' | 'right'
  /** Body: a set-in armhole; false is a drop shoulder. */
  armhole: boolean
  /** Body: how each shoulder is shaped; null for straight shoulders. */
  shoulder: 'cast-off' | 'hold' | null
  /** Body: the neckline (a front deep, a back shallow); null for none. */
  neck: 'round' | 'v' | 'square' | null
  /** Sleeve: a set-in cap; false is a straight top (drop shoulder). */
  cap: boolean
  /** One value per size of the plan (in the plan's size order), in the piece's unit. */
  measurements: Partial<Record<ShapeMeasurement, number[]>>
  /** Ease added to a measurement for every size (same unit, may be negative); absent is 0. */
  ease: Partial<Record<ShapeMeasurement, number>>
}

export interface PlanPieceInput {
  name: string
  /** Pieces knitted more than once (two sleeves): copies 2. */
  copies: number
  targetWidth: number
  targetLength: number
  unit: LengthUnit
  /** Added to the target width before needles are counted (same unit; may be negative). */
  ease: number
  sections: PlanSection[]
  /**
   * Null (or absent): a rectangle of targetWidth + ease whose sections decide its rows. Given:
   * the piece is shaped from its measurements for the size being worked out, and its sections
   * fill its height from the cast-on up (plain in slot 'A' above the last one; cut at the top).
   */
  shape?: PieceShape | null
}

export interface PlanPerson { id: number; name: string }

/** GET /api/plans?studioId (knitters see published plans only). */
export interface PlanSummary {
  id: number
  studioId: number
  name: string
  /** The plan's sizes in order, smallest first, as the designer names them ("S", "M" … or "chest 86"). */
  sizes: string[]
  machineId: number | null
  swatchId: number | null
  yarns: PlanYarnSlot[]
  floatLimit: number
  published: boolean
  pieceCount: number
  createdBy: PlanPerson | null
  updatedBy: PlanPerson | null
  createdAt: string
  updatedAt: string
}

export type PlanWarningKind
  = | 'long-floats'
    | 'colours-close'
    | 'needles-over-bed'
    | 'repeat-over-patterning-width'
    | 'low-stock'
    | 'no-gauge'
    | 'no-estimate'
    | 'section'

export interface PlanWarning {
  kind: PlanWarningKind
  /** Piece index (0-based) and section index, when the warning is about one. */
  piece?: number
  section?: number
  message: string
}

/** The engine's numbers for one section (null where the section has no such number). */
export interface PlanSectionNumbers {
  kind: PlanSectionKind
  /** Chart rows (motif) or rows (plain, shaping); 0 for notes. */
  rows: number
  /** Motif: repeats across the needles in work, with the centred (or given) offset. */
  placement: { offset: number; fullRepeats: number; leftoverLeft: number; leftoverRight: number; chartWidth: number } | null
  /** Motif: longest float per colour (main, contrast) in stitches and mm. */
  maxFloat: [number, number] | null
  maxFloatMm: [number, number] | null
  /** Shaping: spreadShaping and describeShaping, e.g. "every 7th row ×4, every 8th row ×4". */
  shaping: { steps: { every: number; times: number }[]; text: string; stitchesAfter: number } | null
}

export interface PlanPieceNumbers {
  /** stitchesForWidth(target width + ease). */
  needles: number
  /** rowsForLength(target length). */
  targetRows: number
  /** Chart/plain rows the sections add up to (compare with targetRows). */
  plannedRows: number
  /** Compiled timeline: machine rows (passes) and colour changes. */
  machineRows: number
  colourChanges: number
  sections: PlanSectionNumbers[]
  /** What the preview draws: the timeline a project would freeze, with each section's motif offset and shaping. */
  preview: { timeline: PieceTimeline; offsets: number[]; shaping: (SectionShaping | null)[] }
  /** A shaped piece's counts for the size worked out (null for a rectangle). */
  shape: PieceShapeNumbers | null
}

/** A shaped piece's counts in one size (the print sheet lists them size by size). */
export interface PieceSizeCounts {
  /** The size these numbers are for. */
  size: string
  castOn: number
  /** Fabric rows from the cast-on to the top, and the machine rows (the neck's two sides knit the top twice). */
  height: number
  machineRows: number
  /** Needles the piece spans on the bed at its widest (what must fit the machine). */
  widest: number
  counts: ShapedPiece['counts']
}

export interface PieceShapeNumbers extends PieceSizeCounts {
  /** Rows the sections give before they are fitted to the height (plain in slot A added above, or cut at the top). */
  sectionRows: number
}

export interface PlanPiece extends PlanPieceInput {
  id: number
  position: number
  /** Null when the plan has no swatch or the piece cannot be worked out (see warnings). */
  numbers: PlanPieceNumbers | null
  /** A shaped piece's counts in every size, in the plan's size order (a size that cannot be worked out says why); null for a rectangle or without a swatch. */
  sizeCounts: (PieceSizeCounts | { size: string; error: string })[] | null
}

export interface PlanYarnNeed {
  slot: string
  yarnId: number
  name: string
  hex: string
  /** Over every piece times its copies. */
  grams: number
  metres: number
  floatGrams: number
  gramsOnHand: number
  low: boolean
}

export interface PlanDetail extends PlanSummary {
  /** The size (index into `sizes`) the pieces' numbers, warnings and estimate are worked out for: `?size=` of the request, 0 by default. */
  size: number
  /**
   * Bumped by every change. Send it back with a change (`version` in the PATCH body or
   * `If-Match: "<version>"`): if the plan has moved on since, the answer is a 409 whose
   * `data.current` is the plan as it is now, and nothing is saved.
   */
  version: number
  notes: string
  pieces: PlanPiece[]
  /** Gauge of the plan's swatch, null without one. */
  gauge: SwatchGauge | null
  warnings: PlanWarning[]
  /** Colour pairs of the plan's slots (main vs each other slot). */
  contrast: ({ slots: [string, string] } & Distinguishability)[]
  /** Null when the swatch has no weight or there is no swatch or machine. */
  estimate: { model: string; yarns: PlanYarnNeed[] } | null
}

/** GET /api/studios/:studioId/production: one project not yet finished, for owners and designers. */
export interface ProductionItem {
  projectId: number
  name: string
  status: 'planned' | 'knitting'
  knitter: { id: number; name: string }
  /** The plan it was started from, as named then; null for projects made another way. */
  plan: { id: number; name: string } | null
  pieceCount: number
  piecesDone: number
  completedRows: number
  totalRows: number
  /** completedRows / totalRows, 0–1. */
  progress: number
  lastKnittedAt: string | null
  /** Median ms per row over the recent steps (pauses of 5 min or more left out); null with too few. */
  msPerRow: number | null
  /** "about 1 h 40 min" of knitting left at that pace, or null. */
  timeLeft: string | null
  /** Now + time left: knitting time only, so a guide rather than a date to promise. */
  estimatedFinish: string | null
}
