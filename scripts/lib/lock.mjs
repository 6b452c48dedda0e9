import { mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { log } from './log.mjs'

/**
 * One `npm test` at a time per checkout: runs share the private MariaDB, recreate the
 * test database and rebuild .output, so a second run waits for the first.
 * A lock whose run is gone (its pid is not alive, or it is older than `staleMs`) is taken over.
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
        if (Date.now() - statSync(path).mtimeMs > staleMs || !holderAlive(path)) { rmSync(path, { recursive: true, force: true }); continue }
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

/** False when the lock names a process that no longer runs (a run that was killed). */
function holderAlive(path) {
  let pid
  try { pid = Number(readFileSync(`${path}/pid`, 'utf8')) }
  catch { return true } // being written just now
  if (!Number.isInteger(pid) || pid <= 0) return true
  try { process.kill(pid, 0); return true }
  catch (error) { return error.code === 'EPERM' }
}
