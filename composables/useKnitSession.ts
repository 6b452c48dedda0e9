import { recordStep, resolveConflict, savePiece, StepError, type CachedPiece, type LocalProgress } from '~~/offline'
import { shapedNeedles } from '#shared/engine'
import { compilePieceTimeline } from '#shared/piece/timeline'
import { shapeStep } from '#shared/piece/shapeSteps'
import { cuesForStep, knitPosition } from '#shared/piece/position'
import { describeDuration, msPerRow, type PaceStep } from '#shared/piece/pace'
import type { PieceDetail } from '#shared/types/knit'
import type { PieceTimeline } from '#shared/piece/types'

/**
 * One piece at the machine: its timeline, the local place (IndexedDB, live), and the steps.
 * A step is written to IndexedDB (event + place, one transaction) before the screen moves;
 * the syncer sends it when it can. The store is the signed-in person's (stores/offline.ts);
 * the live queries end with the calling scope (the knit page), or when that store closes.
 */
export function useKnitSession(pieceId: number) {
  const offline = useOfflineStore()
  const userId = useAccountStore().me?.user.id
  if (!userId) throw new Error('The knit view needs a signed-in person')
  // The knit view opens the store at once (its chunk carries the store's code already).
  const opening = offline.open(userId)
  /** This person's store while it is open: it closes when they sign out or their session ends. */
  const mine = () => (offline.current?.userId === userId ? offline.current : null)
  const { state: syncState } = storeToRefs(offline)
  const settings = useKnitSettings()
  const sound = useKnitSound(settings)
  const loadError = ref('')
  const stepError = ref('')
  const busy = ref(false)

  const piece = useLiveQuery(() => mine()?.db, db => db.pieces.get(pieceId), undefined as CachedPiece | undefined).value
  const progress = useLiveQuery(() => mine()?.db, db => db.progress.get(pieceId), undefined as LocalProgress | undefined).value
  const pending = useLiveQuery(() => mine()?.db, db => db.outbox.where('pieceId').equals(pieceId).count(), 0).value

  // Fetch the piece when online (and keep it for offline); otherwise use the kept copy.
  async function load() {
    loadError.value = ''
    const { db, syncer } = await opening
    try {
      const detail = await $fetch<PieceDetail>(`/api/pieces/${pieceId}`)
      await savePiece(db, detail)
      void syncer.refresh([pieceId])
    }
    catch (error) {
      if (await db.pieces.get(pieceId)) return // offline or server away: the kept copy will do
      loadError.value = describeApiError(error).message
    }
  }

  const timeline = computed(() => piece.value?.timeline as PieceTimeline | undefined)
  const compiled = computed(() => (timeline.value ? compilePieceTimeline(timeline.value) : null))
  const completedRows = computed(() => progress.value?.completedRows ?? 0)
  const position = computed(() => (timeline.value && compiled.value
    ? knitPosition(timeline.value, compiled.value, completedRows.value, settings.step.value)
    : null))

  // A shaped piece's row at the machine (null for a rectangle or once finished).
  const shapeNeedles = computed(() => (timeline.value?.shape ? shapedNeedles(timeline.value.shape) : null))
  const shaping = computed(() => {
    const shape = timeline.value?.shape
    const row = position.value?.row
    return shape && shapeNeedles.value && row ? shapeStep(shape, shapeNeedles.value, row - 1) : null
  })

  const paceSteps = useLocalStorage<PaceStep[]>(knitPaceKey(pieceId), [])
  const finishEstimate = computed(() => {
    const perRow = msPerRow(paceSteps.value)
    if (!position.value || perRow === null) return null
    return describeDuration(perRow * (position.value.totalRows - position.value.completedRows))
  })

  async function move(kind: 'advance' | 'back' | 'jump', to: number) {
    const store = mine()
    if (!compiled.value || busy.value || !store) return
    busy.value = true
    stepError.value = ''
    const before = completedRows.value
    sound.unlock()
    try {
      const saved = await recordStep(store.db, pieceId, { kind, to, totalRows: compiled.value.rows.length })
      // Show the committed place at once; the live query catches up (and follows other tabs).
      progress.value = saved.progress
      performance.mark('floatwise:step-saved') // read by the tap benchmark
      if (kind === 'advance') {
        paceSteps.value = [...paceSteps.value.slice(-40), { at: Date.now(), rows: to - before }]
        announce(before, to)
      }
      void store.syncer.nudge()
    }
    catch (error) {
      stepError.value = error instanceof StepError ? error.message : 'This step could not be saved on the tablet. Try again.'
    }
    finally {
      busy.value = false
    }
  }

  /** The spoken words for the shaping on the rows after `after` completed rows. */
  function shapingWords(after: number) {
    const shape = timeline.value?.shape
    if (!shape || !shapeNeedles.value || after >= shape.rows.length) return 'Shaping on the next rows.'
    const s = shapeStep(shape, shapeNeedles.value, after)
    return [...s.now, ...s.next].map(x => x.text).join('. ') || 'Shaping on the next rows.'
  }

  function announce(before: number, after: number) {
    if (!compiled.value || !timeline.value) return
    const cues = cuesForStep(compiled.value, timeline.value, before, after, settings.ahead.value)
    if (!cues.length) return
    const next = knitPosition(timeline.value, compiled.value, after, settings.step.value)
    const cue = cues[0]!
    const spoken = cue === 'end'
      ? 'Piece finished.'
      : cue === 'change'
        ? `Colour change in ${next.rowsToChange ?? 0} rows: ${next.nextYarns.map(y => y.name).join(' and ')}.`
        : cue === 'shaping'
          ? shapingWords(after)
          : `New section: ${next.section?.label ?? ''}.`
    // Shaping rings the section's sound: both ask the knitter to look before knitting on.
    sound.play(cue === 'shaping' ? 'section' : cue, spoken)
  }

  const total = computed(() => compiled.value?.rows.length ?? 0)
  // The step's rows come from knitPosition: a pair, or one row where a side of the neck ends.
  const advance = () => move('advance', position.value?.stepRows?.[1] ?? Math.min(completedRows.value + settings.step.value, total.value))
  const undo = () => move('back', Math.max(completedRows.value - settings.step.value, 0))
  const jump = (to: number) => move('jump', to)

  async function resolve(keep: 'ours' | 'theirs') {
    const store = mine()
    if (!store) return
    await resolveConflict(store.db, pieceId, keep)
    void store.syncer.nudge()
  }

  return {
    piece,
    progress,
    pending,
    position,
    shaping,
    compiled,
    timeline,
    completedRows,
    finishEstimate,
    syncState,
    settings,
    loadError,
    stepError,
    busy,
    load,
    advance,
    undo,
    jump,
    resolve,
    unlockSound: sound.unlock,
  }
}
