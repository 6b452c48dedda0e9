import { spawn, spawnSync } from 'node:child_process'

/** Runs a command to completion with inherited output; throws on a non-zero exit. */
export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', ...options })
  if (result.error) throw result.error
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} exited with ${result.status}`)
  return result
}

/** Runs a command and returns its trimmed stdout (or null when it fails). */
export function capture(command, args, options = {}) {
  const result = spawnSync(command, args, { encoding: 'utf8', ...options })
  return result.status === 0 ? result.stdout.trim() : null
}

/** Starts a long-running child that shares our terminal. */
export function start(command, args, options = {}) {
  return spawn(command, args, { stdio: 'inherit', ...options })
}

export function which(name) {
  for (const dir of (process.env.PATH ?? '').split(':').concat(['/usr/sbin', '/usr/bin', '/sbin'])) {
    const path = `${dir}/${name}`
    if (capture('test', ['-x', path]) !== null) return path
  }
  return null
}
