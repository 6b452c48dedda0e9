import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { root } from '../support/appServer'

// Dexie and the syncer stay out of what every page loads before it paints: the offline store
// (stores/offline.ts) starts with the app but loads ~~/offline with import() (DEVELOPERS.md,
// "The offline store"). Checked on the built app: the shell's entry script and every chunk it
// imports statically, against a string of Dexie's own code.
const publicDir = join(root, '.output/public')
const dexieMark = 'DatabaseClosedError'

function staticImports(source: string): string[] {
  return [...source.matchAll(/(?:import|export)\s*(?:[\w$*{}\s,]+from\s*)?["']\.\/([\w.-]+\.js)["']/g)].map(([, file]) => file!)
}

describe('the entry chunk', () => {
  it('and the chunks it imports statically hold no Dexie; Dexie is in a chunk of its own, loaded later', () => {
    const shell = readFileSync(join(publicDir, 'index.html'), 'utf8')
    const entry = shell.match(/<script type="module" src="\/_nuxt\/([\w.-]+\.js)"/)?.[1]
    expect(entry).toBeTruthy()
    const seen = new Set<string>()
    const visit = (file: string) => {
      if (seen.has(file)) return
      seen.add(file)
      for (const next of staticImports(readFileSync(join(publicDir, '_nuxt', file), 'utf8'))) visit(next)
    }
    visit(entry!)
    expect(seen.size).toBeGreaterThan(0)
    const withDexie = [...seen].filter(f => readFileSync(join(publicDir, '_nuxt', f), 'utf8').includes(dexieMark))
    expect(withDexie).toEqual([])
    // The mark is one Dexie's built code really holds: some chunk of the app has it.
    const chunks = readdirSync(join(publicDir, '_nuxt')).filter(f => f.endsWith('.js'))
    expect(chunks.some(f => readFileSync(join(publicDir, '_nuxt', f), 'utf8').includes(dexieMark))).toBe(true)
  })
})
