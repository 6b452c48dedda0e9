import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs'
import { dirname, join } from 'node:path'

// The project's own source files and their imports, resolved to paths, for tests that check
// which code may reach which (zod out of the browser, the layers of shared/).

export const root = join(import.meta.dirname, '../..')

export function sourceFiles(dir: string): string[] {
  if (!existsSync(dir)) return []
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? sourceFiles(path) : /\.(vue|ts)$/.test(name) ? [path] : []
  })
}

/** The file an import names inside the project (`#shared/…`, `~/…`, `~~/…`, relative), or null. */
function resolveSpec(spec: string, from: string): string | null {
  const base = spec === '#shared' || spec.startsWith('#shared/')
    ? join(root, 'shared', spec.slice('#shared'.length))
    : spec.startsWith('~~/') || spec.startsWith('~/')
      ? join(root, spec.replace(/^~~?\//, ''))
      : spec.startsWith('.') ? join(dirname(from), spec) : null
  if (!base) return null
  return [base, `${base}.ts`, `${base}.vue`, join(base, 'index.ts')].find(p => existsSync(p) && statSync(p).isFile()) ?? null
}

/** Imports of a file (value imports only unless `withTypes`), each with the project file it names. */
export function importsOf(path: string, withTypes = false): { spec: string; file: string | null }[] {
  const source = readFileSync(path, 'utf8')
  const pattern = withTypes
    ? /^\s*(?:import|export)\s[^;]*?from\s+['"]([^'"]+)['"]/gm
    : /^\s*(?:import|export)\s+(?!type\b)[^;]*?from\s+['"]([^'"]+)['"]/gm
  return [...source.matchAll(pattern)].map(([, spec]) => ({ spec: spec!, file: resolveSpec(spec!, path) }))
}
