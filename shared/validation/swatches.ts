import { z } from 'zod'
import { count, id, lengthUnit, notes, stored } from './common'

// The create body carries studioId; the patch body is the same fields, all optional (studioId never moves).

const swatchFields = {
  machineId: id.nullable(),
  stitchSize: z.string('must be text').trim().max(60, 'must be at most 60 characters'),
  mainYarnId: id.nullable(),
  contrastYarnId: id.nullable(),
  stitches: count(1, 1000),
  rows: count(1, 5000),
  width: stored(1000, 2),
  height: stored(1000, 2),
  unit: lengthUnit,
  grams: stored(100000, 2).nullable(),
  washed: z.boolean('must be true or false'),
  notes,
}
export const swatchBody = z.object({
  studioId: id,
  ...swatchFields,
  machineId: swatchFields.machineId.default(null),
  stitchSize: swatchFields.stitchSize.default(''),
  mainYarnId: swatchFields.mainYarnId.default(null),
  contrastYarnId: swatchFields.contrastYarnId.default(null),
  grams: swatchFields.grams.default(null),
  washed: swatchFields.washed.default(false),
  notes: notes.default(''),
})
export const swatchPatch = z.object(swatchFields).partial()
export type SwatchBody = z.infer<typeof swatchBody>
export type SwatchPatch = z.infer<typeof swatchPatch>
