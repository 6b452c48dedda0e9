import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import { importsOf, root, sourceFiles } from '../support/sourceImports'

// The app validates nothing itself (the server answers with field errors), so zod stays out of
// the browser: it would add about 26 KB gzipped to a page, and its eval probe trips our
// Content-Security-Policy. App code reads limits from zod-free modules (e.g. shared/motif/limits.ts).
const appFolders = ['pages', 'components', 'composables', 'stores', 'plugins', 'layouts', 'middleware', 'offline', 'service-worker']

describe('app code', () => {
  it('never reaches zod, directly or through the modules it imports', () => {
    const seen = new Set<string>()
    const offenders: string[] = []
    const walk = (path: string) => {
      if (seen.has(path)) return
      seen.add(path)
      for (const { spec, file } of importsOf(path)) {
        if (spec === 'zod') offenders.push(relative(root, path))
        if (file) walk(file)
      }
    }
    appFolders.flatMap(f => sourceFiles(join(root, f))).forEach(walk)
    expect(seen.size).toBeGreaterThan(50) // the walk really followed the app's imports
    expect(offenders).toEqual([])
  })
})
