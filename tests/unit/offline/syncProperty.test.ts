import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { createSyncer, readPieceState, recordStep } from '../../../offline'
import { deviceWithPiece, fakeSyncServer, type FakeFailure } from '../../support/offline'

const totalRows = 40

// A knitting session: taps (as fractions, so every generated step is valid at any place),
// flushes at random points, and a network that fails in every way it can.
const action = fc.oneof(
  fc.record({ type: fc.constant('step' as const), kind: fc.constantFrom('advance', 'back', 'jump'), pick: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({
    type: fc.constant('flush' as const),
    failure: fc.constantFrom<FakeFailure | 'ok'>('ok', 'ok', 'network', 'lost-answer', 500, 503),
    // Not awaited: the knitter keeps tapping while the request is out.
    background: fc.boolean(),
  }),
)

function targetRow(kind: 'advance' | 'back' | 'jump', from: number, pick: number): number | null {
  // pick may be exactly 1: keep advance ≤ totalRows and back < from.
  if (kind === 'advance') return from < totalRows ? Math.min(totalRows, from + 1 + Math.floor(pick * (totalRows - from))) : null
  if (kind === 'back') return from > 0 ? Math.min(from - 1, Math.floor(pick * from)) : null
  return Math.round(pick * totalRows)
}

describe('sync, by property', () => {
  it('ends with the server at the device\'s place and every event stored exactly once', async () => {
    await fc.assert(fc.asyncProperty(
      fc.integer({ min: 0, max: totalRows }),
      fc.array(action, { maxLength: 60 }),
      fc.integer({ min: 1, max: 7 }),
      async (start, actions, batchSize) => {
        const db = await deviceWithPiece({ completedRows: start, totalRows, version: 3 })
        const server = fakeSyncServer({ 1: { completedRows: start, version: 3 } })
        const syncer = createSyncer({ db, fetch: server.fetch, batchSize, random: () => 0 })
        const made: string[] = []
        const inflight: Promise<unknown>[] = []
        let place = start
        for (const a of actions) {
          if (a.type === 'flush') {
            server.failures.push(a.failure)
            if (a.background) inflight.push(syncer.flush())
            else await syncer.flush()
            continue
          }
          const to = targetRow(a.kind, place, a.pick)
          if (to === null) continue
          made.push((await recordStep(db, 1, { kind: a.kind, to, totalRows })).event.id)
          place = to
        }
        await Promise.all(inflight)
        server.failures.length = 0 // a failure meant for a flush that had nothing to send
        const final = await syncer.flush()
        expect(final.ok).toBe(true)
        const { progress, pending } = await readPieceState(db, 1)
        expect(pending).toBe(0)
        expect(progress?.completedRows).toBe(place)
        expect(server.piece().completedRows).toBe(place)
        // Stored once each, in device order, and every one applied: one device never conflicts with itself.
        expect([...server.stored.keys()]).toEqual(made)
        expect([...server.stored.values()].every(e => e.outcome === 'applied')).toBe(true)
        expect(server.piece().version).toBe(3 + made.length)
        expect((await syncer.state()).status).toBe('synced')
        db.close()
      },
    ), { numRuns: 150 })
  }, 120_000)
})
