// `npm run soak` (through scripts/soak.mjs, which does the set-up): options --seconds N, --devices N, --seed N.
// Exits 1 on a lost or duplicated event, or on any 5xx but a 503 with Retry-After.
import { printSoak, runSoak } from './soak'

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`)
  return i > 0 ? Number(process.argv[i + 1]) : fallback
}

const report = await runSoak({
  seconds: arg('seconds', 60), devices: arg('devices', 200), seed: arg('seed', Date.now() % 1_000_000),
  log: line => console.log(`[floatwise] ${line}`),
})
printSoak(report)
const clean = report.duplicates === 0 && report.lost === 0 && report.piecesOff === 0 && report.stillQueued === 0
  && report.otherServerErrors === 0 && report.unavailableWithoutRetryAfter === 0
process.exit(clean ? 0 : 1)
