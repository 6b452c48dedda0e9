// A chart as a punch card: the chart repeated across the card's width and down to a loop of
// whole repeats, the rows that join the loop, a card read back from a photo, and the card the
// way it is printed and goes into the reader.
//
// Model (declared):
// - A card is `width` needles wide (a whole number of chart repeats) and `rows` rows long,
//   `holes[r * width + c]` row-major from the first row knitted; 1 = punched, the needle knits
//   the contrast yarn. Card column c carries chart column c mod chart width and card row r chart
//   row r mod chart height, so `holes` is in the chart's orientation (types.ts): column 0 is the
//   leftmost stitch seen from the knit side, row 0 the first row knitted.
// - The loop is the fewest whole chart repeats down that cover `minRows`; then `joinRows` more
//   rows repeat the card's first rows, where the two ends overlap when the loop is clipped
//   together (common practice: a joined card overlaps at its ends, and rows punched alike there
//   keep the motif unbroken). Join rows continue the repeat, so row loop + j carries the same
//   chart row as row j.
// - A repeat that does not divide the card's width is refused (KnittingInputError on `width`);
//   `cardWidthFits` names the chart widths that would fit, nearest first, so the page can offer
//   to crop or widen the chart.
// - As printed (`cardAsPunched`): at a single-bed machine the knitter faces the purl side (common
//   practice: the knit side faces away), so left and right swap, the same one swap as
//   `atMachine` in sides.ts. The card goes into the reader facing the knitter, its columns
//   meeting the needles left to right as the knitter sees them; for the knit side to show the
//   motif as drawn, the card is printed and punched mirrored left to right: printed column c
//   carries `holes` column width − 1 − c. Rows keep their order (row 0 the first row knitted,
//   drawn at the bottom; the card's top row is the last row knitted). An asymmetric motif (a
//   letter) shows it: an "F" on the chart is a mirrored "F" on the card.
// - Read from a photo (`cardFromGrid`): the photo shows the card as printed (the face that meets
//   the knitter, top row at the top), so it is mirrored back and turned the chart's way up. A
//   hole is taken to be dark, the card lying on a dark backing (a dark cloth shows the holes);
//   `invert` reads light holes (a card held against the light). This is the same rule as
//   `imageToChart` in picture.ts: dark cells are contrast unless inverted.
// - Blank card rows (`blankCardRows`): rows where one yarn knits no stitch at all across the
//   card, i.e. floats.ts's unused rows over the card's width.

import { assertChart, MAX_CHART_HEIGHT, MAX_CHART_WIDTH } from './chart'
import { KnittingInputError } from './errors'
import { analyseFloats } from './floats'
import { otsuThreshold } from './picture'
import type { Chart } from './types'
import { requireInteger, requireObject } from './validate'

/** What a card holds: `holes` is `rows` × `width`, row-major. */
export interface CardHoles {
  width: number
  rows: number
  holes: Uint8Array
}

/** A chart on a punch card (see the header for the orientation). */
export interface PunchCard extends CardHoles {
  repeatsAcross: number
  repeatsDown: number
}

/** The card asked for: needles across, the least loop length, the joining rows after it. */
export interface PunchCardSize {
  width: number
  minRows: number
  joinRows: number
}

/** Whether a repeat fits a card's width, and the chart widths that do, nearest first. */
export interface CardWidthFit {
  fits: boolean
  divisors: number[]
}

/** Rows (0-based card rows) where a yarn knits nothing across the card. */
export interface BlankCardRows {
  mainUnused: number[]
  contrastUnused: number[]
}

/**
 * Does a chart `chartWidth` stitches wide repeat evenly across a card `cardWidth` needles wide?
 * `divisors` lists every width from 1 to `cardWidth` that divides it, nearest to `chartWidth`
 * first; of two equally near, the narrower first (cropping keeps what is drawn, widening needs
 * new stitches drawn). 5 on 24: fits false, divisors 4, 6, 3, 2, 8, 1, 12, 24.
 */
export function cardWidthFits(chartWidth: number, cardWidth: number): CardWidthFit {
  requireInteger(chartWidth, 'chartWidth', 1, MAX_CHART_WIDTH)
  requireInteger(cardWidth, 'cardWidth', 1, MAX_CHART_WIDTH)
  const divisors: number[] = []
  for (let d = 1; d <= cardWidth; d++) if (cardWidth % d === 0) divisors.push(d)
  divisors.sort((a, b) => Math.abs(a - chartWidth) - Math.abs(b - chartWidth) || a - b)
  return { fits: cardWidth % chartWidth === 0, divisors }
}

/**
 * The chart repeated over a card: `repeatsAcross` = card width / chart width (which must divide
 * it), `repeatsDown` the fewest whole repeats with repeatsDown × chart height ≥ minRows, then
 * `joinRows` rows repeating the card's first rows. rows = repeatsDown × chart height + joinRows.
 */
export function punchCard(chart: Chart, card: PunchCardSize): PunchCard {
  assertChart(chart)
  requireObject(card, 'card')
  const width = requireInteger(card.width, 'width', 1, MAX_CHART_WIDTH)
  const minRows = requireInteger(card.minRows, 'minRows', 1, MAX_CHART_HEIGHT)
  const joinRows = requireInteger(card.joinRows, 'joinRows', 0, MAX_CHART_HEIGHT)
  const { width: w, height: h, cells } = chart
  const fit = cardWidthFits(w, width)
  if (!fit.fits) {
    const offer = fit.divisors.slice(0, 4).join(', ')
    throw new KnittingInputError(
      `width: a ${w}-stitch repeat does not go evenly into a ${width}-needle card; crop or widen the chart to ${offer} stitches`,
      { field: 'width' },
    )
  }
  const repeatsDown = Math.ceil(minRows / h)
  const loop = repeatsDown * h
  const rows = loop + joinRows
  if (rows > MAX_CHART_HEIGHT) {
    const field = loop > MAX_CHART_HEIGHT ? 'minRows' : 'joinRows'
    throw new KnittingInputError(`${field}: the card would be ${rows} rows long, at most ${MAX_CHART_HEIGHT} allowed`, { field })
  }
  const holes = new Uint8Array(rows * width)
  // The first chart height of rows, each chart row repeated across, then copied down.
  for (let r = 0; r < Math.min(h, rows); r++) {
    const row = cells.subarray(r * w, (r + 1) * w)
    for (let c = 0; c < width; c += w) holes.set(row, r * width + c)
  }
  const block = h * width
  for (let start = block; start < holes.length; start += block) {
    holes.copyWithin(start, 0, Math.min(block, holes.length - start))
  }
  return { width, rows, holes, repeatsAcross: width / w, repeatsDown }
}

function checkCard(card: unknown): asserts card is CardHoles {
  const { width, rows, holes } = requireObject(card, 'card')
  requireInteger(width, 'width', 1, MAX_CHART_WIDTH)
  requireInteger(rows, 'rows', 1, MAX_CHART_HEIGHT)
  if (!(holes instanceof Uint8Array) || holes.length !== (rows as number) * (width as number)) {
    throw new KnittingInputError(`holes: expected a Uint8Array of ${String(rows)} × ${String(width)}`, { field: 'holes' })
  }
  for (let i = 0; i < holes.length; i++) {
    if (holes[i]! > 1) {
      const row = Math.floor(i / (width as number)) + 1
      const col = (i % (width as number)) + 1
      throw new KnittingInputError(`holes row ${row}, column ${col}: expected 0 or 1, got ${holes[i]}`, { field: 'holes', row, col })
    }
  }
}

/**
 * The card as it is printed, punched and read: every row mirrored left to right (see the
 * header), rows in the same order. Everything else is kept; applied twice it gives the card back.
 */
export function cardAsPunched<T extends CardHoles>(card: T): T {
  checkCard(card)
  const { width, rows, holes } = card
  const out = new Uint8Array(holes.length)
  for (let r = 0; r < rows; r++) {
    const base = r * width
    for (let c = 0; c < width; c++) out[base + c] = holes[base + width - 1 - c]!
  }
  return { ...card, holes: out }
}

/**
 * Card rows where one yarn knits nothing (a float the whole card wide, floats.ts's unused rows):
 * `mainUnused` rows punched right across, `contrastUnused` rows with no hole.
 */
export function blankCardRows(card: CardHoles): BlankCardRows {
  checkCard(card)
  const { unusedRows } = analyseFloats({ width: card.width, height: card.rows, cells: card.holes }, { needles: card.width })
  return { mainUnused: unusedRows[0], contrastUnused: unusedRows[1] }
}

/**
 * A chart read from a photo of a card: `darkness` per cell (0 white … 255 black), row-major from
 * the photo's top row, the card as printed. Each value is rounded to a level 0..255; a level
 * above `threshold` (Otsu 1979 on the 256-level histogram when omitted) is dark, and dark is a
 * hole, i.e. contrast (`invert` for light holes). The photo's top row becomes the last chart row
 * knitted and its left column the chart's right column (the card is printed mirrored).
 * Otsu needs two bands: a photo of one kind of cell only (no hole, or punched right across), or
 * with very few of one kind (under a twentieth of the cells), can be split inside the larger
 * band; give `threshold` then.
 */
export function cardFromGrid(darkness: ArrayLike<number>, cols: number, rows: number, threshold?: number, invert = false): Chart {
  requireInteger(cols, 'cols', 1, MAX_CHART_WIDTH)
  requireInteger(rows, 'rows', 1, MAX_CHART_HEIGHT)
  if (typeof darkness?.length !== 'number' || darkness.length !== cols * rows) {
    throw new KnittingInputError(
      `darkness: expected ${cols * rows} values (${cols} × ${rows}), got ${String(darkness?.length)}`,
      { field: 'darkness' },
    )
  }
  if (threshold !== undefined && (typeof threshold !== 'number' || !(threshold >= 0 && threshold <= 255))) {
    throw new KnittingInputError(`threshold: expected a number from 0 to 255, got ${String(threshold)}`, { field: 'threshold' })
  }
  if (typeof invert !== 'boolean') {
    throw new KnittingInputError(`invert: expected true or false, got ${String(invert)}`, { field: 'invert' })
  }
  const levels = new Uint8Array(cols * rows)
  const histogram = new Float64Array(256)
  for (let i = 0; i < levels.length; i++) {
    const v = darkness[i]
    if (typeof v !== 'number' || !(v >= 0 && v <= 255)) {
      const row = Math.floor(i / cols) + 1
      const col = (i % cols) + 1
      throw new KnittingInputError(
        `darkness[${i}] (row ${row} from the top, column ${col}): expected a value from 0 to 255, got ${String(v)}`,
        { field: 'darkness', row, col },
      )
    }
    // The nudge keeps halves rounding up through floating error, as picture.ts does.
    levels[i] = Math.min(255, Math.round(v + 1e-9))
    histogram[levels[i]!]! += 1
  }
  const t = threshold ?? otsuThreshold(histogram)
  const cells = new Uint8Array(cols * rows)
  for (let y = 0; y < rows; y++) {
    const chartRow = rows - 1 - y
    for (let x = 0; x < cols; x++) {
      const dark = levels[y * cols + x]! > t
      cells[chartRow * cols + (cols - 1 - x)] = dark !== invert ? 1 : 0
    }
  }
  return { width: cols, height: rows, cells }
}
