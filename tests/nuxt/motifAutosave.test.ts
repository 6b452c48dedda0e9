import { describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody } from 'h3'

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

async function mountAutosave(rows: () => string[]) {
  let autosave!: ReturnType<typeof useMotifAutosave>
  await mountSuspended(defineComponent({
    setup() {
      autosave = useMotifAutosave(41, rows, { delayMs: 20 })
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
})
