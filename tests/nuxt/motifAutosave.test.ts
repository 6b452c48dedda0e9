import { describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody } from 'h3'
import type { MotifDetail } from '#shared/types/motif'

// The editor's autosave: a burst of changes is one PATCH carrying the latest rows; the state
// reads saved / saving / unsaved / error; a refused save says why and the next change retries.
const bodies: Record<string, unknown>[] = []
let refuse = false
registerEndpoint('/api/motifs/41', {
  method: 'PATCH',
  handler: async (event) => {
    const body = await readBody(event)
    bodies.push(body)
    if (refuse) {
      event.node.res.statusCode = 400
      return { statusCode: 400, message: 'rows: row 1, column 2: unexpected character "?"' }
    }
    return { id: 41, name: body.name ?? 'Test', updatedBy: { id: 1, name: 'Idris' }, updatedAt: new Date().toISOString() }
  },
})

// A motif kept like the server keeps it: a change from an old version is a 409 with the copy.
const motif43: MotifDetail = {
  id: 43, studioId: 1, name: 'Shared', width: 4, height: 2, rows: ['....', '....'], published: false, floatReport: null, picture: null,
  createdBy: null, updatedBy: { id: 2, name: 'Morag' }, createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z', version: 3,
}
let stored43 = structuredClone(motif43)
const bodies43: Record<string, unknown>[] = []
registerEndpoint('/api/motifs/43', {
  method: 'PATCH',
  handler: async (event) => {
    const body = await readBody(event)
    bodies43.push(body)
    if (body.version !== undefined && body.version !== stored43.version) {
      event.node.res.statusCode = 409
      return { statusCode: 409, message: 'Changed elsewhere: Morag saved this motif after you opened it', data: { current: stored43 } }
    }
    stored43 = { ...stored43, ...body, version: stored43.version + 1, updatedBy: { id: 1, name: 'Idris' } }
    return stored43
  },
})
/** Someone else saves the motif (as another tab or designer would). */
function savedElsewhere(rows: string[]) {
  stored43 = { ...stored43, rows, version: stored43.version + 1, updatedBy: { id: 2, name: 'Morag' }, updatedAt: '2026-01-02T10:00:00.000Z' }
}

async function mountAutosave(rows: () => string[], id = 41, from?: MotifDetail) {
  let autosave!: ReturnType<typeof useMotifAutosave>
  await mountSuspended(defineComponent({
    setup() {
      autosave = useMotifAutosave(id, rows, { delayMs: 20, from })
      return () => h('p', autosave.words.value)
    },
  }))
  return autosave
}
const until = async (check: () => boolean) => {
  for (let i = 0; i < 200 && !check(); i++) await new Promise(r => setTimeout(r, 10))
  expect(check()).toBe(true)
}

describe('useMotifAutosave', () => {
  it('sends one PATCH for a burst of changes, with the rows as they are at send time', async () => {
    bodies.length = 0
    let current = ['....']
    const autosave = await mountAutosave(() => current)
    autosave.queue({ rows: true })
    current = ['x...']
    autosave.queue({ rows: true })
    autosave.queue({ name: 'Harbour stars' })
    expect(autosave.state.value).toBe('unsaved')
    current = ['xx..']
    await until(() => autosave.state.value === 'saved')
    expect(bodies).toEqual([{ rows: ['xx..'], name: 'Harbour stars' }])
    expect(autosave.words.value).toBe('Saved')
  })

  it('says why a save was refused, and tries again with the next change', async () => {
    bodies.length = 0
    refuse = true
    const autosave = await mountAutosave(() => ['x?..'])
    autosave.queue({ rows: true })
    await until(() => autosave.state.value === 'error')
    expect(autosave.words.value).toContain('row 1, column 2')
    refuse = false
    autosave.queue({ published: true })
    await until(() => autosave.state.value === 'saved')
    // The refused rows go again with the new change: nothing is silently dropped.
    expect(bodies.at(-1)).toEqual({ rows: ['x?..'], published: true })
  })

  describe('changed elsewhere (409)', () => {
    const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
    async function conflicted(mine: { rows: string[] }) {
      stored43 = structuredClone(motif43)
      bodies43.length = 0
      const autosave = await mountAutosave(() => mine.rows, 43, structuredClone(motif43))
      mine.rows = ['x...', '....']
      autosave.queue({ rows: true })
      await until(() => autosave.state.value === 'saved')
      expect(bodies43).toEqual([{ rows: ['x...', '....'], version: 3 }])
      savedElsewhere(['x...', '...x'])
      mine.rows = ['xx..', '....']
      autosave.queue({ rows: true })
      await until(() => autosave.state.value === 'conflict')
      // Sent from version 4 (the answer's), refused: version 5 is someone else's.
      expect(bodies43.at(-1)).toEqual({ rows: ['xx..', '....'], version: 4 })
      return autosave
    }

    it('sends the version it was made from, holds every change while the copies differ, and keeps mine when asked', async () => {
      const mine = { rows: [] as string[] }
      const autosave = await conflicted(mine)
      expect(autosave.theirs.value).toMatchObject({ version: 5, rows: ['x...', '...x'], updatedBy: { name: 'Morag' } })
      expect(autosave.words.value).toBe('Not saved: changed elsewhere. Choose which copy to keep')
      // Further changes are kept, not sent: nothing overwrites theirs until the designer chooses.
      mine.rows = ['xxx.', '....']
      autosave.queue({ rows: true })
      autosave.queue({ name: 'Mine' })
      await autosave.flush()
      await sleep(60)
      expect(bodies43).toHaveLength(2)
      expect(autosave.state.value).toBe('conflict')

      await autosave.keepMine({ published: true })
      expect(bodies43.at(-1)).toEqual({ rows: ['xxx.', '....'], name: 'Mine', published: true, version: 5 })
      expect(autosave.state.value).toBe('saved')
      expect(autosave.theirs.value).toBeNull()
      expect(stored43).toMatchObject({ version: 6, rows: ['xxx.', '....'], name: 'Mine' })
    })

    it('takes theirs: their copy is handed over, my unsaved changes are dropped and nothing is sent', async () => {
      const autosave = await conflicted({ rows: [] })
      const current = autosave.takeTheirs()
      expect(current).toMatchObject({ version: 5, rows: ['x...', '...x'] })
      expect(autosave.state.value).toBe('saved')
      await sleep(60)
      expect(bodies43).toHaveLength(2)
      // The next change is made from their version.
      autosave.queue({ name: 'After theirs' })
      await until(() => autosave.state.value === 'saved' && bodies43.length === 3)
      expect(bodies43.at(-1)).toEqual({ name: 'After theirs', version: 5 })
    })

    it('combines: the stitches I changed since my last save, on top of their chart', async () => {
      const mine = { rows: [] as string[] }
      const autosave = await conflicted(mine)
      // Saved base x... / ....; I added the second stitch of row 1, they the last stitch of row 2.
      expect(autosave.combined(mine.rows)).toEqual({ rows: ['xx..', '...x'], mine: 1, theirs: 1 })
      expect(autosave.combined(['xx...', '.....'])).toBeNull()
      mine.rows = autosave.combined(mine.rows)!.rows
      await autosave.keepMine()
      expect(bodies43.at(-1)).toEqual({ rows: ['xx..', '...x'], version: 5 })
      expect(stored43).toMatchObject({ version: 6, rows: ['xx..', '...x'] })
    })
  })
})
