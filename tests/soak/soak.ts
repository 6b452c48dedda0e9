import { spawnSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { createSequelize } from '../../server/db/connection'
import { initModels } from '../../server/db/models'
import { getDeviceId } from '../../offline'
import { privateMariadb } from '../../scripts/lib/mariadb.mjs'
import { keptSecret } from '../../scripts/lib/secrets.mjs'
import { typescriptRun } from '../../scripts/lib/typescript.mjs'
import { freePort, root, startAppServer } from '../support/appServer'
import { auditSoak, type Audit } from './audit'
import { openDevice, type Device, type RequestLog } from './device'
import { makeSoakStudio, soakPassword } from './fixtures'

// Simulated tablets syncing against the built server and a private MariaDB of the soak's own
// (under .data/mariadb-soak, so stopping it disturbs no other run), while the database is
// stopped and started once and the app server is killed and started once.

export interface SoakOptions {
  seconds: number
  devices: number
  /** Every n-th knitter also has a piece both of their tablets knit. */
  sharedEvery?: number
  /** Mean pause between two taps of one tablet. */
  stepMs?: number
  /** How long the database stays down. */
  outageMs?: number
  seed?: number
  log?: (line: string) => void
}

export interface SoakReport extends Audit {
  requests: number
  p50: number
  p99: number
  byStatus: Record<number, number>
  networkErrors: number
  /** 5xx answers more than a second after the database was back (a pool that never recovers). */
  serverErrorsAfterOutage: number
  /** 503 answers (the database not answering: the client keeps its rows and retries). */
  unavailable: number
  /** Every other 5xx, a 500 above all: there should be none, outage or not. */
  otherServerErrors: number
  unavailableWithoutRetryAfter: number
  stillQueued: number
  memoryMb: { start: number; beforeKill: number; end: number }
}

// A small seeded generator, so a failing run can be repeated with the same taps.
function seeded(seed: number) {
  let s = seed >>> 0
  return () => {
    s = (s + 0x6D2B79F5) >>> 0
    let t = Math.imul(s ^ (s >>> 15), 1 | s)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
const rssMb = (pid: number | undefined) => {
  const line = pid ? readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find(l => l.startsWith('VmRSS:')) : undefined
  return line ? Math.round(Number(line.replace(/\D+/g, '')) / 1024) : Number.NaN
}
const percentile = (sorted: number[], p: number) => sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))]! : Number.NaN

export async function runSoak(options: SoakOptions): Promise<SoakReport> {
  const { seconds, devices: deviceCount, sharedEvery = 10, stepMs = 1000, outageMs = Math.min(5000, seconds * 100), seed = Date.now() } = options
  const log = options.log ?? (() => {})
  const random = seeded(seed)
  log(`soak: ${deviceCount} devices for ${seconds} s (seed ${seed})`)

  const mariadb = privateMariadb(root, await freePort(), 'mariadb-soak')
  mariadb.stop() // one left by a run that was killed: it may be on another port
  await mariadb.start()
  const url = mariadb.ensureDatabase('floatwise_soak', 'floatwise', keptSecret(join(root, '.data/db-password')), { fresh: true })
  const dbScript = typescriptRun(root, 'scripts/db.ts')
  const migrated = spawnSync(process.execPath, [...dbScript.args, 'migrate'], {
    cwd: root,
    env: { ...process.env, ...dbScript.env, DATABASE_URL: url },
    encoding: 'utf8',
  })
  if (migrated.status !== 0) throw new Error(`migrations failed:\n${migrated.stderr}`)
  const sequelize = createSequelize(url)
  initModels(sequelize)
  let server: Awaited<ReturnType<typeof startAppServer>> | undefined
  try {
    const knitters = await makeSoakStudio(sequelize, { knitters: Math.ceil(deviceCount / 2), sharedEvery, chartRows: 4000 })
    server = await startAppServer({ DATABASE_URL: url })
    const app = server
    const requests: RequestLog = { latencies: [], byStatus: new Map(), networkErrors: 0, serverErrorsAt: [], unavailableWithoutRetryAfter: 0 }
    const devices: Device[] = []
    for (const [k, knitter] of knitters.entries()) {
      const address = `10.77.${k >> 8}.${k & 255}`
      const res = await fetch(`${app.baseUrl}/api/auth/login`, {
        method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': address },
        body: JSON.stringify({ email: knitter.email, password: soakPassword }),
      })
      if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`)
      const cookie = res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))!.split(';')[0]!
      for (const own of knitter.ownPieces) {
        if (devices.length === deviceCount) break
        const pieces = knitter.sharedPiece ? [own, knitter.sharedPiece] : [own]
        devices.push(await openDevice(app.baseUrl, { cookie, address }, pieces, requests))
      }
    }
    const memoryMb = { start: rssMb(app.pid()), beforeKill: Number.NaN, end: Number.NaN }
    log(`soak: ${devices.length} devices signed in, server RSS ${memoryMb.start} MB; knitting…`)

    const started = Date.now()
    let databaseBackAt = Number.POSITIVE_INFINITY
    const running = () => Date.now() - started < seconds * 1000
    const knitting = devices.map(d => d.knit(running, stepMs, random))
    const troubles = (async () => {
      await sleep(seconds * 300)
      log(`soak: stopping the database at ${((Date.now() - started) / 1000).toFixed(1)} s`)
      mariadb.stop()
      await sleep(outageMs)
      await mariadb.start()
      databaseBackAt = Date.now()
      log(`soak: database back at ${((Date.now() - started) / 1000).toFixed(1)} s`)
      await sleep(Math.max(0, seconds * 600 - (Date.now() - started)))
      memoryMb.beforeKill = rssMb(app.pid())
      log(`soak: killing the app server at ${((Date.now() - started) / 1000).toFixed(1)} s (RSS ${memoryMb.beforeKill} MB)`)
      await app.kill()
      await sleep(500)
      await app.start()
      log(`soak: app server back at ${((Date.now() - started) / 1000).toFixed(1)} s`)
    })()
    await Promise.all([...knitting, troubles])

    // The knitters stop; each tablet sends what it still holds (answering open conflicts).
    let stillQueued = 0
    for (let round = 0; round < 10; round++) {
      for (const d of devices) await d.resolveOpenConflicts(random)
      await Promise.all(devices.map(d => d.syncer.flush()))
      stillQueued = (await Promise.all(devices.map(d => d.pending()))).reduce((a, b) => a + b, 0)
      if (stillQueued === 0) break
      await sleep(500)
    }
    memoryMb.end = rssMb(app.pid())

    const journals = await Promise.all(devices.map(async d => ({ deviceId: await getDeviceId(d.db), events: d.journal })))
    const pieceIds = [...new Set(devices.flatMap(d => d.pieces))]
    const audit = await auditSoak(sequelize, journals, pieceIds)
    for (const d of devices) d.db.close()
    const sorted = requests.latencies.slice().sort((a, b) => a - b)
    return {
      ...audit, stillQueued, memoryMb,
      requests: sorted.length, p50: percentile(sorted, 0.5), p99: percentile(sorted, 0.99),
      byStatus: Object.fromEntries(requests.byStatus), networkErrors: requests.networkErrors,
      serverErrorsAfterOutage: requests.serverErrorsAt.filter(at => at > databaseBackAt + 1000).length,
      unavailable: requests.byStatus.get(503) ?? 0,
      otherServerErrors: [...requests.byStatus].filter(([status]) => status >= 500 && status !== 503).reduce((n, [, count]) => n + count, 0),
      unavailableWithoutRetryAfter: requests.unavailableWithoutRetryAfter,
    }
  }
  finally {
    await server?.close()
    await sequelize.close()
    mariadb.stop()
  }
}

export function printSoak(r: SoakReport, print: (line: string) => void = console.log) {
  print(`events sent: ${r.recorded}`)
  print(`events stored: ${r.stored} (${r.conflicts} kept as conflicts)`)
  print(`requests: ${r.requests} answered (${Object.entries(r.byStatus).map(([s, n]) => `${s}: ${n}`).join(', ')}), ${r.networkErrors} without an answer`)
  print(
    `503 (database not answering): ${r.unavailable}, of which without Retry-After: ${r.unavailableWithoutRetryAfter}; other 5xx (500 …): ${r.otherServerErrors}`,
  )
  print(`5xx more than 1 s after the database was back: ${r.serverErrorsAfterOutage}`)
  print(`latency: p50 ${r.p50.toFixed(0)} ms, p99 ${r.p99.toFixed(0)} ms`)
  print(
    `server memory (RSS): ${r.memoryMb.start} MB at start, ${r.memoryMb.beforeKill} MB before the kill, ${r.memoryMb.end} MB at the end (after the restart)`,
  )
  print(`still queued on devices: ${r.stillQueued}`)
  print(`pieces not matching a replay of their log: ${r.piecesOff}`)
  print(`duplicates: ${r.duplicates}`)
  print(`lost: ${r.lost}`)
}
