#!/usr/bin/env node
// `npm test`: the same set-up as `npm start` against a fresh test database, then every
// test project, lint and type check. The last line is `Tests: N passed, N failed`.
import { existsSync, readFileSync, rmSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { ensureDependencies } from './lib/deps.mjs'
import { log } from './lib/log.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
ensureDependencies(root)

const { prepareDatabase } = await import('./lib/setup.mjs')
const { ensureBuild } = await import('./lib/build.mjs')
const { ensureChromium } = await import('./lib/chromium.mjs')
const { spawnSync } = await import('node:child_process')

const { withCheckoutLock } = await import('./lib/lock.mjs')
const { mkdirSync } = await import('node:fs')
mkdirSync(join(root, '.data'), { recursive: true })
const code = await withCheckoutLock(join(root, '.data/test.lock'), runEverything)
process.exit(code)

async function runEverything() {
  ensureChromium()
  const { env, stop } = await prepareDatabase(root, { database: 'floatwise_test', fresh: true })
  ensureBuild(root)

  const bin = name => join(root, 'node_modules/.bin', name)
  const results = join(root, '.data/test-results.json')
  rmSync(results, { force: true })
  const testEnv = { ...process.env, ...env, FLOATWISE_ROOT: root }

  const extraArgs = process.argv.slice(2)
  const vitest = spawnSync(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${results}`, ...extraArgs], {
    cwd: root,
    env: testEnv,
    stdio: 'inherit',
  })

  // Static checks count as one test each, named in the output.
  const checks = []
  if (extraArgs.length === 0) {
    for (const [name, command, args] of [
      ['lint (eslint)', bin('eslint'), ['.']],
      ['type check (nuxt typecheck)', bin('nuxt'), ['typecheck']],
    ]) {
      log(`Running ${name}…`)
      const r = spawnSync(command, args, { cwd: root, env: testEnv, stdio: 'inherit' })
      checks.push({ name, ok: r.status === 0 })
      log(`${name}: ${r.status === 0 ? 'passed' : 'FAILED'}`)
    }
  }
  stop()

  let passed = 0, failed = 0, skipped = 0
  if (existsSync(results)) {
    const report = JSON.parse(readFileSync(results, 'utf8'))
    passed = report.numPassedTests
    skipped = report.numPendingTests + report.numTodoTests
    // A test file that fails to load has no tests to count: count the file.
    failed = report.numFailedTests + report.testResults.filter(f => f.status === 'failed' && f.assertionResults.length === 0).length
  }
  else if (vitest.status !== 0) {
    failed += 1
  }
  passed += checks.filter(c => c.ok).length
  failed += checks.filter(c => !c.ok).length
  if (vitest.status !== 0 && failed === 0) failed = 1
  console.log(`Tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`)
  return failed > 0 ? 1 : 0
}
