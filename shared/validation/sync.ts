import { z } from 'zod'
import { MAX_PLAN_ROWS } from '#shared/engine/rows'
import { rowEventKinds } from '#shared/piece/types'
import { count, id } from './common'

export const deviceIdSchema = z.string('must be text').regex(/^[A-Za-z0-9_-]{8,64}$/, 'must be 8–64 letters, digits, "_" or "-"')
const rowCount = count(0, MAX_PLAN_ROWS)

// When a tap can have happened: not before Floatwise existed, and not more than a day ahead of
// the server, since device clocks drift (and time zones are offsets, not errors). The bounds also
// keep every stored time inside DATETIME's years 1000–9999: "9999-12-31T23:59:59-10:00" is 10000 in UTC.
const EARLIEST_EVENT_MS = Date.parse('2020-01-01T00:00:00Z')
const CLOCK_AHEAD_MS = 24 * 60 * 60_000
function inEventRange(at: string) {
  const ms = Date.parse(at)
  return Number.isNaN(ms) || (ms >= EARLIEST_EVENT_MS && ms <= Date.now() + CLOCK_AHEAD_MS) // NaN: the format check speaks
}

export const rowEventSchema = z.object({
  // Stored lower-case: the id column compares without case, so 'A…' and 'a…' are one event.
  id: z.uuid('must be a UUID').transform(s => s.toLowerCase()),
  pieceId: id,
  kind: z.enum(rowEventKinds, 'must be "advance", "back" or "jump"'),
  from: rowCount,
  to: rowCount,
  version: count(0, 2 ** 31 - 1),
  at: z.iso.datetime({ offset: true, error: 'must be an ISO date-time' })
    .refine(inEventRange, 'must be between 2020-01-01 and a day after the server\'s time (check the device\'s clock)'),
})
export type RowEventInput = z.infer<typeof rowEventSchema>

export const MAX_SYNC_EVENTS = 500

export const syncBody = z.object({
  deviceId: deviceIdSchema,
  events: z.array(rowEventSchema, 'must be a list of row events').max(MAX_SYNC_EVENTS, `at most ${MAX_SYNC_EVENTS} events per request`).default([]),
  /** Pieces whose authoritative place the device wants to hear about even with no events. */
  pieceIds: z.array(id, 'must be a list of piece ids').max(100, 'at most 100 pieces').optional(),
})
export type SyncBody = z.infer<typeof syncBody>
