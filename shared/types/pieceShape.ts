// Which measurements a shaped piece needs, and the limits of their values: read by the server's
// schema (shared/validation/plans.ts), by the planner (shared/planner/sizes.ts) and by the
// editor, so it lives below all three and imports no zod.

import { shapeMeasurements, type PieceShape, type ShapeMeasurement } from './plan'

/** The measurements a piece's choices call for, in the table's order (shapeMeasurements). */
export interface ShapeNeeds { required: ShapeMeasurement[]; optional: ShapeMeasurement[] }

type ShapeChoices = Pick<PieceShape, 'kind' | 'armhole' | 'shoulder' | 'neck' | 'cap'>

/**
 * Body: the hem and the length to the underarm always, the chest optional (absent: straight
 * sides); a set-in armhole its three, shoulders their width and drop, a neck its width and depth.
 * Sleeve: the cuff and the length to the underarm, the upper arm optional; a cap its three.
 * Choices of the other kind (a sleeve's armhole, a body's cap) call for nothing: the schema
 * refuses them.
 */
export function shapeNeeds(shape: ShapeChoices): ShapeNeeds {
  const required = new Set<ShapeMeasurement>(['hemWidth', 'lengthToUnderarm'])
  if (shape.kind === 'body') {
    if (shape.armhole) ['armholeCastOff', 'armholeDecrease', 'armholeDepth'].forEach(m => required.add(m as ShapeMeasurement))
    if (shape.shoulder) ['shoulderWidth', 'shoulderDrop'].forEach(m => required.add(m as ShapeMeasurement))
    if (shape.neck) ['neckWidth', 'neckDepth'].forEach(m => required.add(m as ShapeMeasurement))
  }
  else if (shape.cap) ['capCastOff', 'capHeight', 'capTopWidth'].forEach(m => required.add(m as ShapeMeasurement))
  return { required: shapeMeasurements.filter(m => required.has(m)), optional: ['width'] }
}

/** Every measurement the piece uses, required first in table order (then the optional width). */
export const shapeRows = (shape: ShapeChoices): ShapeMeasurement[] => {
  const { required, optional } = shapeNeeds(shape)
  return shapeMeasurements.filter(m => required.includes(m) || optional.includes(m))
}

/** Largest value of a measurement, in cm or in (the unit is the piece's; 500 is generous for both). */
export const SHAPE_VALUE_MAX = 500
/** Ease on a measurement, either way, in the piece's unit. */
export const SHAPE_EASE_MAX = 50
/** Most sizes a plan may have. */
export const PLAN_SIZES_MAX = 12
/** Longest size name. */
export const SIZE_NAME_MAX = 20
/**
 * Measurements that may be 0: no cast-off or no decrease at the armhole or cap, a straight
 * shoulder (drop 0). Every other one is a real length and must be more than 0.
 */
export const mayBeZero: ReadonlySet<ShapeMeasurement> = new Set(['shoulderDrop', 'armholeCastOff', 'armholeDecrease', 'capCastOff'])
