import { expect, it } from 'vitest'
import { printSoak, runSoak } from '../soak/soak'

// The short soak: 20 tablets for a few seconds through one database restart and one app
// server kill (its own MariaDB and server, so the other test files are not disturbed).
it('loses and duplicates no row event through a database restart and a server kill', async () => {
  const report = await runSoak({ seconds: 8, devices: 20, sharedEvery: 3, stepMs: 400, outageMs: 1000 })
  printSoak(report)
  expect(report.recorded).toBeGreaterThan(100)
  expect(report).toMatchObject({
    duplicates: 0,
    lost: 0,
    piecesOff: 0,
    stillQueued: 0,
    serverErrorsAfterOutage: 0,
    otherServerErrors: 0,
    unavailableWithoutRetryAfter: 0,
  })
  expect(report.stored).toBe(report.recorded)
}, 180_000)
