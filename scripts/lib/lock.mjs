import { mkdirSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { log } from './log.mjs'

/**
 * One `npm test` at a time per checkout: runs share the private MariaDB, recreate the
 * test database and rebuild .output, so a second run waits for the first.
 * A lock older than `staleMs` (a run that was killed) is taken over.
 */
export async function withCheckoutLock(path, work, staleMs = 30 * 60_000) {
  let announced = false
  for (;;) {
    try {
      mkdirSync(path, { recursive: false })
      writeFileSync(`${path}/pid`, String(process.pid))
      break
    }
    catch (error) {
      if (error.code !== 'EEXIST') throw error
      try {
        if (Date.now() - statSync(path).mtimeMs > staleMs) { rmSync(path, { recursive: true, force: true }); continue }
      }
      catch { continue }
      if (!announced) { log('Another test run is using this checkout; waiting for it…'); announced = true }
      await new Promise(r => setTimeout(r, 1000))
    }
  }
  const release = () => rmSync(path, { recursive: true, force: true })
  process.once('exit', release)
  try { return await work() }
  finally { release() }
}
