import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs'
import { dirname, join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

// The app validates nothing itself (the server answers with field errors), so zod stays out of
// the browser: it would add about 26 KB gzipped to a page, and its eval probe trips our
// Content-Security-Policy. App code reads limits from zod-free modules (e.g. shared/motif/limits.ts).
const root = join(import.meta.dirname, '../..')
const appFolders = ['pages', 'components', 'composables', 'stores', 'plugins', 'layouts', 'middleware', 'service']

function files(dir: string): string[] {
  if (!existsSync(dir)) return []
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? files(path) : /\.(vue|ts)$/.test(name) ? [path] : []
  })
}

/** Value imports (not `import type`) of a file, with the project's own ones resolved to paths. */
function imports(path: string): { spec: string; file: string | null }[] {
  const source = readFileSync(path, 'utf8')
  return [...source.matchAll(/^\s*(?:import|export)\s+(?!type\b)[^;]*?from\s+['"]([^'"]+)['"]/gm)].map(([, spec]) => {
    const base = spec!.startsWith('~~/') || spec!.startsWith('~/') ? join(root, spec!.replace(/^~~?\//, '')) : spec!.startsWith('.') ? join(dirname(path), spec!) : null
    const file = base ? [base, `${base}.ts`, `${base}.vue`, join(base, 'index.ts')].find(p => existsSync(p) && statSync(p).isFile()) ?? null : null
    return { spec: spec!, file }
  })
}

describe('app code', () => {
  it('never reaches zod, directly or through the modules it imports', () => {
    const seen = new Set<string>()
    const offenders: string[] = []
    const walk = (path: string) => {
      if (seen.has(path)) return
      seen.add(path)
      for (const { spec, file } of imports(path)) {
        if (spec === 'zod') offenders.push(relative(root, path))
        if (file) walk(file)
      }
    }
    appFolders.flatMap(f => files(join(root, f))).forEach(walk)
    expect(seen.size).toBeGreaterThan(50) // the walk really followed the app's imports
    expect(offenders).toEqual([])
  })
})
