import { z } from 'zod'
import { CARD_DEFAULTS, CARD_LIMITS } from '#shared/motif/cardSettings'
import { count, id, nameSchema, notes, stored, technique } from './common'

// The create body carries studioId; the patch body is the same fields, all optional (studioId never moves).

const mm = (min: number, max: number) => z.number('must be a number').min(min, `must be at least ${min} mm`).max(max, `must be at most ${max} mm`)
  .refine(n => Math.abs(Math.round(n * 100) - n * 100) < 1e-6, 'must have at most 2 decimal places (it is kept to 0.01 mm)')
const { pitchMm, edgeMm, minRows, joinRows, readerOffset } = CARD_LIMITS

/** A machine's punch card, whole (a patch replaces it); null: the machine does not pattern from a card. */
export const machineCard = z.object({
  holePitchMm: mm(pitchMm.min, pitchMm.max),
  rowPitchMm: mm(pitchMm.min, pitchMm.max),
  edgeMm: mm(edgeMm.min, edgeMm.max),
  minRows: count(minRows.min, minRows.max),
  joinRows: count(joinRows.min, joinRows.max),
  readerOffset: count(readerOffset.min, readerOffset.max),
}, 'must be the card\'s measures or null')

const machineFields = {
  name: nameSchema,
  needlePitchMm: stored(50, 2),
  needles: count(1, 1000),
  patterningWidth: count(1, 200),
  technique,
  passesPerColour: count(1, 8),
  notes,
  card: machineCard.nullable(),
}
export const machineBody = z.object({
  studioId: id,
  ...machineFields,
  technique: technique.default('together'),
  passesPerColour: count(1, 8).default(2),
  notes: notes.default(''),
  card: machineCard.nullable().default({ ...CARD_DEFAULTS }),
})
export const machinePatch = z.object(machineFields).partial()
export type MachineBody = z.infer<typeof machineBody>
export type MachinePatch = z.infer<typeof machinePatch>
