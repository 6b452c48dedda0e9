#!/usr/bin/env node
// `npm run bench`: performance figures as ratios against a baseline measured in the same
// run (never timed assertions). Each file in tests/bench prints its own table.
import { spawnSync } from 'node:child_process'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { ensureDependencies } from './lib/deps.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
ensureDependencies(root)
const result = spawnSync(join(root, 'node_modules/.bin/vitest'), ['run', '--reporter=verbose', ...process.argv.slice(2)], {
  cwd: root,
  env: { ...process.env, FLOATWISE_BENCH: '1' },
  stdio: 'inherit',
})
process.exit(result.status ?? 1)
