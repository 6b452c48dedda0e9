// A plan's sizes: a shaped piece's measurements for one size turned into the engine's
// ShapeSpec, the grading helpers of the measurement table, and the figures of every size as
// knitters read them (first size, the others in brackets).
//
// Declared model:
// - A measurement is one value per size, in the piece's unit, flat on the finished piece; its
//   ease (one value for every size, absent 0) is added before anything else, and inches become
//   cm at 2.54 (exact) only then, so the engine sees cm with ease included.
// - Grading. Sizes run smallest first. A measurement that drops from one size to the next is
//   always reported: no garment gets smaller as its size grows. Whether a measurement may stay
//   level depends on what it is (common practice): the widths that make the size (the chest and
//   hem of a body, the upper arm of a sleeve) grow with every size, since two sizes with the
//   same chest are the same size; lengths are often graded in steps two sizes share, and small
//   details (cast-offs, decreases, shoulder drop, neck, cuff, cap top) often stay the same for
//   several sizes or all of them, so a level run of those is not a problem.

import { atMachine, inToCm, KnittingInputError, type ShapeSpec } from '#shared/engine'
import type { LengthUnit } from '#shared/types/stock'
import type { PieceShape, ShapeMeasurement } from '#shared/types/plan'
import { mayBeZero, shapeNeeds, shapeRows } from '#shared/types/pieceShape'

export { shapeNeeds, shapeRows, type ShapeNeeds } from '#shared/types/pieceShape'

const labels: Record<ShapeMeasurement, string | { body: string; sleeve: string }> = {
  hemWidth: { body: 'Width at the hem', sleeve: 'Width at the cuff' },
  width: { body: 'Width at the chest', sleeve: 'Width at the upper arm' },
  lengthToUnderarm: 'Length to the underarm',
  armholeCastOff: 'Armhole: cast off each side',
  armholeDecrease: 'Armhole: decrease each side',
  armholeDepth: 'Armhole depth',
  shoulderWidth: 'Shoulder width (each)',
  shoulderDrop: 'Shoulder drop',
  neckWidth: 'Neck width',
  neckDepth: 'Neck depth',
  capCastOff: 'Cap: cast off each side',
  capHeight: 'Cap height',
  capTopWidth: 'Width at the top of the cap',
}

/** The table's words for a measurement ("Width at the chest", a sleeve's "Width at the upper arm"). */
export function measurementLabel(key: ShapeMeasurement, kind: PieceShape['kind']): string {
  const l = labels[key]
  return typeof l === 'string' ? l : l[kind]
}

/** Up to 2 decimals, no trailing zeros: 150, 52.3, 20.25. */
const figure = (n: number) => (Number.isFinite(n) ? String(Math.round(n * 100) / 100) : '–')

/**
 * The engine's spec for size `sizeIndex` (0-based, the plan's order): each measurement the
 * piece's choices call for, plus its ease, in cm. A missing or non-finite value, or one that
 * its ease takes to 0 or below (below 0 for those that may be 0), throws KnittingInputError
 * naming the entry (`shape.measurements.neckWidth[2]`); the caller adds the size's name.
 */
export function sizedShapeSpec(shape: PieceShape, sizeIndex: number, unit: LengthUnit): ShapeSpec {
  if (!Number.isInteger(sizeIndex) || sizeIndex < 0) throw new KnittingInputError(`size: must be a size of the plan, not ${sizeIndex}`, { field: 'size' })
  const { required, optional } = shapeNeeds(shape)
  const at = (key: ShapeMeasurement): number => {
    const field = `shape.measurements.${key}[${sizeIndex}]`
    const label = measurementLabel(key, shape.kind)
    const v = shape.measurements[key]?.[sizeIndex]
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new KnittingInputError(`${field}: ${label} has no number for size ${sizeIndex + 1}`, { field })
    }
    const ease = shape.ease[key] ?? 0
    if (!Number.isFinite(ease)) throw new KnittingInputError(`shape.ease.${key}: the ease of ${label} is not a number`, { field: `shape.ease.${key}` })
    const total = v + ease
    if (mayBeZero.has(key) ? total < 0 : total <= 0) {
      const least = mayBeZero.has(key) ? 'at least 0' : 'more than 0'
      throw new KnittingInputError(`${field}: ${label} with its ease comes to ${figure(total)} ${unit} for size ${sizeIndex + 1}; it must be ${least}`, { field })
    }
    return unit === 'in' ? inToCm(total) : total
  }
  // An optional measurement is used when its row is there; a row with a gap is an error, not a default.
  const maybe = (key: ShapeMeasurement) => (optional.includes(key) && shape.measurements[key] !== undefined ? at(key) : undefined)
  const has = (key: ShapeMeasurement) => required.includes(key)

  // The plan states the carriage as the knitter sees it; the engine counts sides from the knit side.
  const spec: ShapeSpec = {
    kind: shape.kind, carriageStart: atMachine(shape.carriageStart), hemWidth: at('hemWidth'), lengthToUnderarm: at('lengthToUnderarm'),
  }
  const width = maybe('width')
  if (width !== undefined) spec.width = width
  if (has('armholeDepth')) spec.armhole = { castOff: at('armholeCastOff'), decrease: at('armholeDecrease'), depth: at('armholeDepth') }
  if (has('shoulderWidth') && shape.shoulder) spec.shoulder = { width: at('shoulderWidth'), drop: at('shoulderDrop'), method: shape.shoulder }
  if (has('neckWidth') && shape.neck) spec.neck = { width: at('neckWidth'), depth: at('neckDepth'), shape: shape.neck }
  if (has('capHeight')) spec.cap = { castOff: at('capCastOff'), height: at('capHeight'), topWidth: at('capTopWidth') }
  return spec
}

/**
 * `count` values from `first`, each `step` more than the one before (a negative step counts
 * down). Rounded to 0.01 so that repeated adding leaves no float noise (52.300000000000004 is
 * 52.3) while a quarter inch (0.25) survives; values of one decimal come out exactly as typed.
 */
export function fillByStep(first: number, step: number, count: number): number[] {
  if (!Number.isFinite(first)) throw new KnittingInputError('first: the first value must be a number', { field: 'first' })
  if (!Number.isFinite(step)) throw new KnittingInputError('step: the step must be a number', { field: 'step' })
  if (!Number.isInteger(count) || count < 0) throw new KnittingInputError(`count: must be a whole number of sizes, not ${count}`, { field: 'count' })
  return Array.from({ length: count }, (_, i) => Math.round((first + i * step) * 100) / 100)
}

export interface GradingProblem {
  measurement: ShapeMeasurement
  /** The size (0-based) where it goes wrong: the larger of the two compared, or for a row of the wrong length the first size it does not match. */
  size: number
  message: string
}

/** Widths that make the size and so must grow with every size (see the model above). */
const growsEverySize = (key: ShapeMeasurement, kind: PieceShape['kind']) => key === 'width' || (key === 'hemWidth' && kind === 'body')

/**
 * What looks wrong in the grading of the measurements the piece uses: a row with more or fewer
 * values than there are sizes, a value smaller than the size before it, and a size-making width
 * that stays the same. Gaps (no number yet) are skipped: they are not grading.
 */
export function gradingProblems(shape: PieceShape, sizes: string[]): GradingProblem[] {
  const problems: GradingProblem[] = []
  const sizeName = (i: number) => sizes[i] ?? `size ${i + 1}`
  for (const key of shapeRows(shape)) {
    const row = shape.measurements[key]
    if (!row) continue
    const label = measurementLabel(key, shape.kind)
    if (row.length !== sizes.length) {
      const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`
      problems.push({ measurement: key, size: Math.min(row.length, sizes.length), message: `${label} has ${plural(row.length, 'value')} for ${plural(sizes.length, 'size')}` })
    }
    for (let i = 1; i < Math.min(row.length, sizes.length); i++) {
      const before = row[i - 1]!, now = row[i]!
      if (!Number.isFinite(before) || !Number.isFinite(now)) continue
      if (now < before) {
        problems.push({ measurement: key, size: i, message: `${label} gets smaller from ${sizeName(i - 1)} to ${sizeName(i)} (${figure(before)} → ${figure(now)})` })
      }
      else if (now === before && growsEverySize(key, shape.kind)) {
        problems.push({ measurement: key, size: i, message: `${label} is the same for ${sizeName(i - 1)} and ${sizeName(i)} (${figure(now)}): it should grow with every size` })
      }
    }
  }
  return problems
}

export interface SizeFigures {
  /** "150 (162, 174, 186)"; one size is just "150". */
  text: string
  /** Each size's figure in order, the chosen one marked (for a highlight). */
  parts: { value: string; chosen: boolean }[]
}

/** A number for every size, as knitters read it: the first size, then the others in brackets. */
export function sizeFigures(values: (number | string)[], chosen?: number): SizeFigures {
  const parts = values.map((v, i) => ({ value: typeof v === 'number' ? figure(v) : v, chosen: i === chosen }))
  const [first, ...rest] = parts.map(p => p.value)
  const text = first === undefined ? '' : rest.length ? `${first} (${rest.join(', ')})` : first
  return { text, parts }
}

/**
 * A shape's numbers after the sizes changed: `from` has one entry per new size, the index of
 * the old size whose numbers it keeps, or null for a new size. A new size continues the row
 * by the step of the two sizes before it (one before it: the same number; none: no number yet,
 * NaN, for the designer to fill in); a rename keeps the same map and changes nothing.
 */
export function remapShapeSizes(shape: PieceShape, from: (number | null)[]): PieceShape {
  const measurements: PieceShape['measurements'] = {}
  for (const [key, row] of Object.entries(shape.measurements) as [ShapeMeasurement, number[]][]) {
    const out: number[] = []
    from.forEach((j, i) => {
      const kept = j === null ? undefined : row[j]
      if (kept !== undefined) out.push(kept)
      else if (i >= 2 && Number.isFinite(out[i - 1]!) && Number.isFinite(out[i - 2]!)) out.push(Math.round((2 * out[i - 1]! - out[i - 2]!) * 100) / 100)
      else out.push(i >= 1 ? out[i - 1]! : Number.NaN)
    })
    measurements[key] = out
  }
  return { ...shape, measurements, ease: { ...shape.ease } }
}

/**
 * The map remapShapeSizes takes when a new list of size names replaces the old one at once
 * (typed as a range): a size keeps the numbers of the old size of the same name, ignoring
 * capitals; when no name is kept, sizes keep theirs by position.
 */
export function sizeMapByName(before: string[], after: string[]): (number | null)[] {
  const old = before.map(s => s.trim().toLowerCase())
  const byName = after.map((s) => { const j = old.indexOf(s.trim().toLowerCase()); return j < 0 ? null : j })
  return byName.some(j => j !== null) ? byName : after.map((_, i) => (i < before.length ? i : null))
}

/** Size names typed as one list: "XS, S, M, L" (commas, semicolons or new lines), trimmed, blanks and repeats dropped. */
export function parseSizeList(text: string): string[] {
  const out: string[] = []
  for (const name of text.split(/[,;\n]/).map(s => s.trim()).filter(Boolean)) {
    if (!out.some(o => o.toLowerCase() === name.toLowerCase())) out.push(name)
  }
  return out
}
