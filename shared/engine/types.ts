// Plain data shapes shared by the knitting engine. No behaviour here.

/** 0 = main colour, 1 = contrast colour. */
export type Colour = 0 | 1

/**
 * A two-colour chart. `cells[row * width + col]` holds a Colour.
 * Row 0 is the first row knitted (the bottom of the drawn chart); column 0 is
 * the leftmost stitch seen from the knit side.
 */
export interface Chart {
  width: number
  height: number
  cells: Uint8Array
}

/**
 * Where a chart sits on the needles in work: `needles` needles are in work,
 * the leftmost of them knits chart column `offset` (default 0), and the motif
 * repeats across, so needle i knits column (offset + i) mod width.
 */
export interface Placement {
  needles: number
  offset?: number
}

/** A gauge, always kept per 10 cm and as the size of one stitch and one row. */
export interface Gauge {
  stitchesPer10cm: number
  rowsPer10cm: number
  stitchWidthMm: number
  rowHeightMm: number
}

/** A measured swatch: `stitches` × `rows` measured over `widthCm` × `heightCm`. */
export interface SwatchMeasure {
  stitches: number
  rows: number
  widthCm: number
  heightCm: number
}
