import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname } from 'node:path'

/** A secret made once and kept in a file under .data/ (mode 600), or the given value. */
export function keptSecret(path, given) {
  if (given) return given
  if (existsSync(path)) return readFileSync(path, 'utf8').trim()
  mkdirSync(dirname(path), { recursive: true })
  const secret = randomBytes(32).toString('base64url')
  writeFileSync(path, secret + '\n', { mode: 0o600 })
  return secret
}
