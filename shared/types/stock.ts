// Stock: the studio's machines, yarn and swatches, as the API answers with them.
// Times are ISO strings (UTC); lengths carry their unit.

import type { Technique, YarnListItem } from './studio'

export type LengthUnit = 'cm' | 'in'

/** GET/POST /api/machines, PATCH /api/machines/:id. */
export interface MachineItem {
  id: number
  studioId: number
  name: string
  needlePitchMm: number
  /** Needles on the bed. */
  needles: number
  /** Stitches in one pattern repeat the machine can select (punch card or electronic width). */
  patterningWidth: number
  technique: Technique
  passesPerColour: number
  notes: string
  /** The machine's punch card, or null for a machine that does not pattern from one. */
  card: MachineCard | null
  createdAt: string
  updatedAt: string
}

/** A machine's punch card, in the card's own measures (shared/motif/cardSettings.ts has the starting values). */
export interface MachineCard {
  /** Hole centre to hole centre, across and down, in mm. */
  holePitchMm: number
  rowPitchMm: number
  /** Card beyond the outer holes' centres plus half a pitch, each side, in mm. */
  edgeMm: number
  /** The shortest loop that goes round the reader, in rows. */
  minRows: number
  /** Rows repeated at the end, where the card overlaps to join into a loop. */
  joinRows: number
  /** Rows the reader reads ahead of the row being knitted (0: it reads the row knitted). */
  readerOffset: number
}

/** GET /api/yarns (list; keeps YarnListItem's fields), POST /api/yarns, PATCH /api/yarns/:id. */
export interface YarnItem extends YarnListItem {
  studioId: number
  /** Craft Yarn Council name of weightCategory (e.g. "Fine"). */
  weightName: string
  notes: string
  createdAt: string
  updatedAt: string
}

/** GET /api/yarns: a yarn with what the studio's published plans call for. */
export interface YarnStockItem extends YarnItem {
  /** Grams the published plans need of it (their yarn estimates summed), and how many plans. */
  plannedGrams: number
  plannedIn: number
  /** Fewer grams on hand than the published plans need. */
  low: boolean
}

/** The engine's numbers for a swatch. */
export interface SwatchGauge {
  stitchesPer10cm: number
  rowsPer10cm: number
  stitchesPer4in: number
  rowsPer4in: number
  stitchWidthMm: number
  rowHeightMm: number
  /** yarnWeightCategory(stitchesPer4in); null past 40 stitches per 4 in. */
  weightCategory: { category: number; name: string; alsoFits: number[] } | null
}

/** GET/POST /api/swatches, GET/PATCH /api/swatches/:id. */
export interface SwatchItem {
  id: number
  studioId: number
  machineId: number | null
  /** As the knitter typed it: a machine setting is free text. */
  stitchSize: string
  mainYarnId: number | null
  contrastYarnId: number | null
  /** Stitches and rows counted … */
  stitches: number
  rows: number
  /** … over this measured width and height, in `unit`. */
  width: number
  height: number
  unit: LengthUnit
  /** Weight of the whole swatch (needed for the yarn estimate). */
  grams: number | null
  washed: boolean
  notes: string
  gauge: SwatchGauge
  createdAt: string
  updatedAt: string
}
