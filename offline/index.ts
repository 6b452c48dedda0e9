// The client's offline store, outbox and syncer: framework-free (no Vue, no Nuxt), so the app
// (stores/offline.ts), the soak and the bench all run the same code.
export { openFloatwiseDb, getDeviceId, plainData, type FloatwiseDb, type OpenOptions } from './db'
export { recordStep, resolveConflict, savePiece, readPieceState, StepError, type StepInput, type ClientClock, type PieceState } from './progress'
export { createSyncer, type Syncer, type SyncerOptions, type SyncResult } from './sync'
export { readSyncState, type SyncFailure, type SyncState, type SyncStatus } from './syncStore'
export { backoffDelay, retryAfterMs } from './backoff'
export { deleteUserStore, forgetUserStoreUnlessQueued, openUserStore, summariseUnsynced, userStoreName, type UnsyncedSummary } from './userStore'
export { clearPersonalCaches } from './personalCaches'
export type * from './types'
