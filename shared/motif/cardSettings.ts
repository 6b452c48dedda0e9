import type { MachineCard } from '#shared/types/stock'

// Starting values for a standard-gauge punch card (24 holes across), from memory and common
// practice, not a standard: the card page asks the knitter to measure a blank card of their own.
// A reader offset of 0 means the card row at the reading position is the row being knitted;
// many machines read some rows ahead (the machine's manual says how many).
export const CARD_DEFAULTS: Readonly<MachineCard> = Object.freeze({
  holePitchMm: 4.5,
  rowPitchMm: 5,
  edgeMm: 6,
  minRows: 36,
  joinRows: 2,
  readerOffset: 0,
})

/** What the validation and the forms allow. */
export const CARD_LIMITS = Object.freeze({
  pitchMm: { min: 1, max: 20 },
  edgeMm: { min: 0, max: 50 },
  minRows: { min: 1, max: 500 },
  joinRows: { min: 0, max: 20 },
  readerOffset: { min: 0, max: 60 },
})
