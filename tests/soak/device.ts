import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import {
  createSyncer,
  openFloatwiseDb,
  readPieceState,
  recordStep,
  resolveConflict,
  savePiece,
  type FloatwiseDb,
  type PieceDetail,
  type RowEvent,
  type Syncer,
} from '../../offline'

// One simulated tablet: the app's own offline store (its own fake IndexedDB) and syncer,
// a knitter tapping at a machine, and a journal of every event the store recorded.

export interface RequestLog {
  /** Milliseconds of each answered POST /api/sync. */
  latencies: number[]
  byStatus: Map<number, number>
  networkErrors: number
  /** When each 5xx answer came (epoch ms), to tell an outage's errors from a storm after it. */
  serverErrorsAt: number[]
  /** 503 answers without a Retry-After header (a 503 must say when to come back). */
  unavailableWithoutRetryAfter: number
}

export interface Session { cookie: string; address: string }

export interface Device {
  name: string
  db: FloatwiseDb
  syncer: Syncer
  pieces: number[]
  journal: RowEvent[]
  /** Taps at the machine until `running()` says stop. */
  knit: (running: () => boolean, stepMs: number, random: () => number) => Promise<void>
  /** Answers every open conflict (the knitter's choice) so held events may go. */
  resolveOpenConflicts: (random: () => number) => Promise<void>
  pending: () => Promise<number>
}

let counter = 0

export async function openDevice(baseUrl: string, session: Session, pieces: number[], requests: RequestLog): Promise<Device> {
  const name = `soak-device-${++counter}`
  const db = openFloatwiseDb(name, { indexedDB: new IDBFactory(), IDBKeyRange })
  const withSession = { 'cookie': session.cookie, 'x-forwarded-for': session.address }
  const fetchWithSession = async (input: string | URL | Request, init: RequestInit = {}) => {
    const started = performance.now()
    try {
      const res = await fetch(input, { ...init, headers: { ...init.headers as Record<string, string>, ...withSession } })
      requests.latencies.push(performance.now() - started)
      requests.byStatus.set(res.status, (requests.byStatus.get(res.status) ?? 0) + 1)
      if (res.status >= 500) requests.serverErrorsAt.push(Date.now())
      if (res.status === 503 && !res.headers.get('retry-after')) requests.unavailableWithoutRetryAfter += 1
      return res
    }
    catch (error) {
      requests.networkErrors += 1
      throw error
    }
  }
  const syncer = createSyncer({ db, baseUrl, fetch: fetchWithSession as typeof fetch })
  for (const id of pieces) {
    const res = await fetch(`${baseUrl}/api/pieces/${id}`, { headers: withSession })
    if (!res.ok) throw new Error(`${name} could not open piece ${id}: ${res.status}`)
    await savePiece(db, await res.json() as PieceDetail)
  }
  const journal: RowEvent[] = []

  async function tap(pieceId: number, random: () => number) {
    const { piece, progress } = await readPieceState(db, pieceId)
    if (!piece || !progress) return
    if (progress.conflict && progress.resolvingWith === null) {
      journal.push((await resolveConflict(db, pieceId, random() < 0.5 ? 'ours' : 'theirs')).event)
      return
    }
    const at = progress.completedRows
    const total = piece.totalRows
    const r = random()
    // Mostly a row forward; now and then a row unravelled, rarely a jump to another place.
    const step = r < 0.03
      ? { kind: 'jump' as const, to: Math.floor(random() * total) }
      : (r < 0.12 && at > 0) || at >= total
          ? { kind: 'back' as const, to: at - 1 }
          : { kind: 'advance' as const, to: at + 1 }
    journal.push((await recordStep(db, pieceId, { ...step, totalRows: total })).event)
  }

  return {
    name, db, syncer, pieces, journal,
    async knit(running, stepMs, random) {
      syncer.start()
      while (running()) {
        await new Promise(r => setTimeout(r, stepMs * (0.5 + random())))
        if (!running()) break
        // The tablet's own piece most of the time; the shared one (listed last) now and then.
        const pieceId = pieces.length > 1 && random() < 0.3 ? pieces[pieces.length - 1]! : pieces[0]!
        await tap(pieceId, random)
        void syncer.nudge() // as the knit view does after each step
      }
      syncer.stop()
    },
    async resolveOpenConflicts(random) {
      for (const pieceId of pieces) {
        const { progress } = await readPieceState(db, pieceId)
        if (progress?.conflict && progress.resolvingWith === null) journal.push((await resolveConflict(db, pieceId, random() < 0.5 ? 'ours' : 'theirs')).event)
      }
    },
    pending: () => db.outbox.count(),
  }
}
