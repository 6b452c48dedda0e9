import { z } from 'zod'

/**
 * The `version` of a motif or plan that an edit was made from (MotifDetail.version,
 * PlanDetail.version). Optional in every PATCH body: without it the change is applied
 * whatever happened meanwhile, as before versions existed. Kept to the column's range
 * (INT UNSIGNED).
 */
export const editVersion = z.number('must be a number').int('must be a whole number')
  .min(0, 'must be at least 0').max(4_294_967_295, 'must be at most 4294967295')
