import { createHash } from 'node:crypto'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { log } from './log.mjs'
import { run } from './run.mjs'

// Uses only Node's own modules: it runs before node_modules exists.
const marker = 'node_modules/.floatwise-lock-hash'

/** `npm ci` when node_modules is missing or was installed from another package-lock.json. */
export function ensureDependencies(root) {
  const lock = readFileSync(`${root}/package-lock.json`)
  const hash = createHash('sha256').update(lock).digest('hex')
  const installed = existsSync(`${root}/${marker}`) ? readFileSync(`${root}/${marker}`, 'utf8').trim() : ''
  if (installed === hash && existsSync(`${root}/node_modules/nuxt`)) return
  log('Installing npm packages (npm ci)…')
  run('npm', ['ci', '--no-audit', '--no-fund', '--ignore-scripts'], { cwd: root })
  writeFileSync(`${root}/${marker}`, hash + '\n')
}
