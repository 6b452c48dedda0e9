import Dexie, { type EntityTable } from 'dexie'
import type { CachedPiece, LocalProgress, MetaEntry, OutboxEntry } from './types'

// The one IndexedDB database of the client. Schema changes are new `db.version(n + 1)` calls
// below the existing ones; an old version is never edited, because browsers out there hold
// data written under it and Dexie upgrades from whatever version it finds.

export type FloatwiseDb = Dexie & {
  pieces: EntityTable<CachedPiece, 'id'>
  progress: EntityTable<LocalProgress, 'pieceId'>
  outbox: EntityTable<OutboxEntry, 'seq'>
  meta: EntityTable<MetaEntry, 'key'>
}

export interface OpenOptions {
  /**
   * Another tab opened a newer schema (or deletes the database). This connection is closed
   * first so that tab is not blocked; the app then reloads or asks the knitter to.
   */
  onVersionChange?: (event: IDBVersionChangeEvent) => void
  /** A separate IndexedDB (fake-indexeddb in tests: one factory per simulated device). */
  indexedDB?: IDBFactory
  IDBKeyRange?: typeof IDBKeyRange
}

export function openFloatwiseDb(name = 'floatwise', options: OpenOptions = {}): FloatwiseDb {
  const db = new Dexie(name, {
    ...(options.indexedDB ? { indexedDB: options.indexedDB } : {}),
    ...(options.IDBKeyRange ? { IDBKeyRange: options.IDBKeyRange } : {}),
  }) as FloatwiseDb

  db.version(1).stores({
    pieces: 'id, projectId',
    progress: 'pieceId',
    // `&id` makes a second copy of an event impossible and lets answers delete by event id.
    outbox: '++seq, &id, pieceId',
    meta: 'key',
  })

  db.on('versionchange', (event) => {
    // Dexie's own handler closes with auto-open on, so the next query in this tab would try to
    // reopen an older schema and fail; close for good and let the app decide.
    db.close({ disableAutoOpen: true })
    options.onVersionChange?.(event)
    return false
  })
  return db
}

/** Anything written must be plain data: callers may hand in Vue proxies, which IndexedDB cannot clone. */
export function plainData<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

const deviceIdPattern = /^[\w-]{8,64}$/

/** This browser profile's id, made once and kept; the server tells devices apart by it. */
export async function getDeviceId(db: FloatwiseDb): Promise<string> {
  return db.transaction('rw', db.meta, async () => {
    const known = await db.meta.get('deviceId')
    if (typeof known?.value === 'string' && deviceIdPattern.test(known.value)) return known.value
    const id = crypto.randomUUID()
    await db.meta.put({ key: 'deviceId', value: id })
    return id
  })
}

export async function readMeta<T>(db: FloatwiseDb, key: string): Promise<T | undefined> {
  return (await db.meta.get(key))?.value as T | undefined
}

export async function writeMeta(db: FloatwiseDb, key: string, value: unknown): Promise<void> {
  await db.meta.put({ key, value: value === undefined ? null : plainData(value) })
}
