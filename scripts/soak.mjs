#!/usr/bin/env node
// `npm run soak`: simulated tablets against the built server and a private MariaDB of the
// soak's own, through a database stop and an app server kill. Options: --seconds N (60),
// --devices N (200), --seed N. Ends with `duplicates: N` and `lost: N`; exits 1 unless both are 0 and no answer was a 5xx other than a 503 with Retry-After.
import { spawnSync } from 'node:child_process'
import { mkdirSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { ensureDependencies } from './lib/deps.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
ensureDependencies(root)
const { ensureBuild } = await import('./lib/build.mjs')
const { withCheckoutLock } = await import('./lib/lock.mjs')
const { keptSecret } = await import('./lib/secrets.mjs')
const { typescriptRun } = await import('./lib/typescript.mjs')

mkdirSync(join(root, '.data'), { recursive: true })
// The lock: a test run rebuilds .output, which the soak's server runs from.
const code = await withCheckoutLock(join(root, '.data/test.lock'), async () => {
  ensureBuild(root)
  const env = {
    ...process.env,
    FLOATWISE_ROOT: root,
    NUXT_SESSION_PASSWORD: keptSecret(join(root, '.data/session-password'), process.env.NUXT_SESSION_PASSWORD),
  }
  const soak = typescriptRun(root, 'tests/soak/main.ts')
  const result = spawnSync(process.execPath, [...soak.args, ...process.argv.slice(2)], { cwd: root, env: { ...env, ...soak.env }, stdio: 'inherit' })
  return result.status ?? 1
})
process.exit(code)
