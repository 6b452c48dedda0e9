import { z } from 'zod'
import { count, id, nameSchema, notes, stored } from './common'

// The create body carries studioId; the patch body is the same fields, all optional (studioId never moves).

const yarnFields = {
  name: nameSchema,
  hex: z.string('must be text').regex(/^#[0-9a-fA-F]{6}$/, 'must be a colour like #1a2b3c').transform(s => s.toLowerCase()),
  weightCategory: count(0, 7),
  metresPer100g: stored(100000, 1),
  gramsOnHand: z.number('must be a number').min(0, 'must be at least 0').max(1000000, 'must be at most 1000000'),
  notes,
}
export const yarnBody = z.object({ studioId: id, ...yarnFields, gramsOnHand: yarnFields.gramsOnHand.default(0), notes: notes.default('') })
export const yarnPatch = z.object(yarnFields).partial()
export type YarnBody = z.infer<typeof yarnBody>
export type YarnPatch = z.infer<typeof yarnPatch>
