import { log } from './log.mjs'
import { run, which } from './run.mjs'

/** Debian's chromium for the browser tests (no browser download of a test tool's own). */
export function ensureChromium() {
  if (which('chromium')) return
  log('Installing Debian’s chromium for the browser tests (apt-get)…')
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  run('apt-get', ['update', '-qq'], { env })
  run('apt-get', ['install', '-y', '-qq', 'chromium'], { env })
}
