import { z } from 'zod'
import { MAX_PLAN_ROWS } from '#shared/engine/rows'
import { count, id, nameSchema, technique } from './common'

/** The quick "new project" form (a project without a plan): one motif between two plain borders. */
export const newProjectBody = z.object({
  studioId: id,
  name: nameSchema,
  motifId: id,
  borderBefore: count(0, MAX_PLAN_ROWS),
  borderAfter: count(0, MAX_PLAN_ROWS),
  chartRows: count(1, MAX_PLAN_ROWS),
  needles: count(1, 1000),
  technique,
  passesPerColour: count(1, 4).optional(),
  mainYarnId: id,
  contrastYarnId: id,
  machineId: id.nullable().optional(),
  pieces: z.array(z.object({ name: nameSchema }), 'must be a list of pieces')
    .min(1, 'at least one piece').max(12, 'at most 12 pieces'),
  notes: z.string().max(5000, 'must be at most 5000 characters').optional(),
}).refine(b => b.mainYarnId !== b.contrastYarnId, { path: ['contrastYarnId'], message: 'must be a different yarn from the main yarn' })
export type NewProjectBody = z.infer<typeof newProjectBody>
