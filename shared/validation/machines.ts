import { z } from 'zod'
import { count, id, nameSchema, notes, stored, technique } from './common'

// The create body carries studioId; the patch body is the same fields, all optional (studioId never moves).

const machineFields = {
  name: nameSchema,
  needlePitchMm: stored(50, 2),
  needles: count(1, 1000),
  patterningWidth: count(1, 200),
  technique,
  passesPerColour: count(1, 8),
  notes,
}
export const machineBody = z.object({
  studioId: id,
  ...machineFields,
  technique: technique.default('together'),
  passesPerColour: count(1, 8).default(2),
  notes: notes.default(''),
})
export const machinePatch = z.object(machineFields).partial()
export type MachineBody = z.infer<typeof machineBody>
export type MachinePatch = z.infer<typeof machinePatch>
