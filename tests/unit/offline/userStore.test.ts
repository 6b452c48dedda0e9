import { describe, expect, it } from 'vitest'
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import { deleteUserStore, forgetUserStoreUnlessQueued, openUserStore, recordStep, savePiece, summariseUnsynced } from '../../../offline'
import { pieceDetail } from '../../support/offline'

// One simulated tablet per test: its own IndexedDB factory.
function tablet() {
  const options = { indexedDB: new IDBFactory(), IDBKeyRange }
  const names = async () => (await options.indexedDB.databases()).map(d => d.name)
  return { options, names }
}

async function storeWithPiece(userId: number, options: ReturnType<typeof tablet>['options'], queuedSteps: number) {
  const db = openUserStore(userId, options)
  await savePiece(db, pieceDetail({ id: 7, name: 'Sleeve', projectName: 'Harbour jumper' }))
  for (let i = 1; i <= queuedSteps; i++) await recordStep(db, 7, { kind: 'advance', to: 2 * i, totalRows: 120 })
  return db
}

describe('a person’s offline store', () => {
  it('names the pieces whose steps are still queued', async () => {
    const { options } = tablet()
    const db = await storeWithPiece(3, options, 2)
    expect(await summariseUnsynced(db)).toEqual({ steps: 2, pieces: ['Sleeve · Harbour jumper'] })
  })

  it('stays whole, queued steps and all, when the session ended elsewhere with steps not yet sent', async () => {
    const { options, names } = tablet()
    ;(await storeWithPiece(3, options, 1)).close()
    expect(await forgetUserStoreUnlessQueued(3, options)).toBe(1)
    const again = openUserStore(3, options)
    expect(await again.outbox.count()).toBe(1)
    expect(await names()).toEqual(['floatwise-user-3'])
  })

  it('goes when the session ended elsewhere with nothing queued, and is not made anew for someone who never had one', async () => {
    const { options, names } = tablet()
    ;(await storeWithPiece(3, options, 0)).close()
    expect(await forgetUserStoreUnlessQueued(3, options)).toBe(0)
    expect(await forgetUserStoreUnlessQueued(4, options)).toBe(0)
    expect(await names()).toEqual([])
  })

  it('is deleted on sign-out while another tab has it open; that tab is told the store is gone (newVersion null)', async () => {
    const { options, names } = tablet()
    const seen: (number | null)[] = []
    const otherTab = openUserStore(3, { ...options, onVersionChange: e => seen.push(e.newVersion) })
    await savePiece(otherTab, pieceDetail())
    await deleteUserStore(3, options)
    expect(seen).toEqual([null])
    expect(otherTab.isOpen()).toBe(false)
    expect(await names()).toEqual([])
  })
})
