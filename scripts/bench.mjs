#!/usr/bin/env node
// `npm run bench`: performance figures as ratios against a baseline measured in the same
// run (never timed assertions). The same set-up as `npm test`, on a database of its own.
import { spawnSync } from 'node:child_process'
import { mkdirSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { ensureDependencies } from './lib/deps.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
ensureDependencies(root)
const { prepareDatabase } = await import('./lib/setup.mjs')
const { ensureBuild } = await import('./lib/build.mjs')
const { ensureChromium } = await import('./lib/chromium.mjs')
const { withCheckoutLock } = await import('./lib/lock.mjs')

mkdirSync(join(root, '.data'), { recursive: true })
const code = await withCheckoutLock(join(root, '.data/test.lock'), async () => {
  ensureChromium()
  const { env, stop } = await prepareDatabase(root, { database: 'floatwise_bench', fresh: true })
  ensureBuild(root)
  const result = spawnSync(join(root, 'node_modules/.bin/vitest'), ['run', '--reporter=verbose', ...process.argv.slice(2)], {
    cwd: root,
    env: { ...process.env, ...env, FLOATWISE_BENCH: '1', FLOATWISE_ROOT: root },
    stdio: 'inherit',
  })
  stop()
  return result.status ?? 1
})
process.exit(code)
