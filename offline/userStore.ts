import { openFloatwiseDb, type FloatwiseDb, type OpenOptions } from './db'

// Each person who signs in on a device gets an offline store of their own, so people sharing a
// tablet never see each other's pieces or queued rows. This file says where that store lives
// and how it goes when the person leaves.

export function userStoreName(userId: number): string {
  return `floatwise-user-${userId}`
}

export function openUserStore(userId: number, options: OpenOptions = {}): FloatwiseDb {
  return openFloatwiseDb(userStoreName(userId), options)
}

/** Steps still queued on this device, and the pieces they belong to (for the warning). */
export interface UnsyncedSummary {
  steps: number
  pieces: string[]
}

export async function summariseUnsynced(db: FloatwiseDb): Promise<UnsyncedSummary> {
  return db.transaction('r', db.outbox, db.pieces, async () => {
    const queued = await db.outbox.toArray()
    const pieceIds = [...new Set(queued.map(e => e.pieceId))]
    const pieces = await db.pieces.bulkGet(pieceIds)
    return {
      steps: queued.length,
      pieces: pieces.map((p, i) => (p ? `${p.name} · ${p.projectName}` : `piece ${pieceIds[i]}`)),
    }
  })
}

/** Deletes the person's store, queued steps included: only once they are sent or the person chose to lose them. */
export async function deleteUserStore(userId: number, options: OpenOptions = {}): Promise<void> {
  await openUserStore(userId, options).delete()
}

async function storeExists(name: string, factory: IDBFactory | undefined): Promise<boolean> {
  // Where the browser cannot list its databases, opening and deleting an empty one is harmless.
  if (typeof factory?.databases !== 'function') return true
  return (await factory.databases()).some(d => d.name === name)
}

/**
 * The person's session ended without a sign-out on this device (it expired, or was ended
 * elsewhere). Queued steps are never dropped silently: a store holding any stays whole until
 * that person signs in again and it syncs; a store with nothing queued is deleted.
 * Returns how many steps were kept.
 */
export async function forgetUserStoreUnlessQueued(userId: number, options: OpenOptions = {}): Promise<number> {
  const factory = options.indexedDB ?? (typeof indexedDB === 'undefined' ? undefined : indexedDB)
  if (!(await storeExists(userStoreName(userId), factory))) return 0
  const db = openUserStore(userId, options)
  const queued = await db.outbox.count()
  if (queued > 0) {
    db.close()
    return queued
  }
  await db.delete()
  return 0
}
