// One plan piece worked out for one of the plan's sizes: a rectangle (workPlanPiece; the same
// for every size) or a shaped piece (its measurements for that size → workShapedPiece).

import { KnittingInputError } from '#shared/engine'
import type { PlanPieceInput } from '#shared/types/plan'
import { workPlanPiece, type PlanPieceContext, type WorkedPlanPiece } from './planPiece'
import { workShapedPiece } from './shapedPiece'
import { sizedShapeSpec } from './sizes'

export interface PlanSize {
  /** Place in the plan's sizes (0 = the first). */
  index: number
  name: string
}

/** A bad measurement throws a KnittingInputError that names the size as well as the field. */
export function workPiece(piece: PlanPieceInput, ctx: PlanPieceContext, size: PlanSize): WorkedPlanPiece {
  if (!piece.shape) return workPlanPiece(piece, ctx)
  try {
    return workShapedPiece(piece, sizedShapeSpec(piece.shape, size.index, piece.unit), size.name, ctx)
  }
  catch (e) {
    if (!(e instanceof KnittingInputError) || !e.field?.startsWith('shape')) throw e
    throw new KnittingInputError(`size ${size.name}: ${e.message}`, { field: e.field })
  }
}
