import { closeSync, existsSync, mkdirSync, openSync, statSync } from 'node:fs'
import { dirname } from 'node:path'
import { spawnSync } from 'node:child_process'
import { capture, which } from './run.mjs'

// Dumps and restores through the private MariaDB's socket as its root (socket login only).

const safeName = /^\w{1,64}$/

/** A UTC stamp fit for a file name: 20261202T041500Z. */
export const utcStamp = (date = new Date()) => date.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z')

function check(result, what) {
  if (result.error) throw result.error
  if (result.status !== 0) throw new Error(`${what} failed (exit ${result.status}): ${String(result.stderr ?? '').trim()}`)
}

/**
 * One consistent dump of `database` (a snapshot in one transaction, so the app may keep
 * writing). Without CREATE DATABASE/USE, so it can be restored under any name.
 */
export function dumpDatabase(server, database, file) {
  if (!safeName.test(database)) throw new Error(`Not a database name: ${database}`)
  mkdirSync(dirname(file), { recursive: true })
  const out = openSync(file, 'w', 0o600)
  try {
    const result = spawnSync(which('mariadb-dump') ?? 'mariadb-dump', server.client([
      '--single-transaction', '--quick', '--routines', '--triggers', '--events', '--hex-blob', '--default-character-set=utf8mb4', database,
    ]), { stdio: ['ignore', out, 'pipe'], encoding: 'utf8' })
    check(result, 'mariadb-dump')
  }
  finally {
    closeSync(out)
  }
  return { file, bytes: statSync(file).size }
}

export function databaseExists(server, database) {
  const found = capture(which('mariadb') ?? 'mariadb', server.client(['--batch', '--skip-column-names', '-e', `SHOW DATABASES LIKE '${database}'`]))
  return found === database
}

/**
 * Loads a dump into `database`: a new one, or (with `replace`) one dropped and made again.
 * The app user gets the same rights it has on the app database.
 */
export function restoreDatabase(server, file, database, { replace = false, appUser = 'floatwise' } = {}) {
  if (!safeName.test(database)) throw new Error(`Not a database name: ${database}`)
  if (!existsSync(file)) throw new Error(`No such dump: ${file}`)
  if (databaseExists(server, database) && !replace)
    throw new Error(`Database ${database} exists; choose another name with --into, or add --replace to overwrite it.`)
  const sql = statements => check(spawnSync(which('mariadb') ?? 'mariadb', server.client(['-e', statements]), { encoding: 'utf8' }), 'mariadb')
  sql([
    `DROP DATABASE IF EXISTS \`${database}\`;`,
    `CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
    `GRANT ALL PRIVILEGES ON \`${database}\`.* TO '${appUser}'@'127.0.0.1';`,
  ].join(' '))
  const input = openSync(file, 'r')
  try {
    check(
      spawnSync(which('mariadb') ?? 'mariadb', server.client(['--default-character-set=utf8mb4', database]), {
        stdio: [input, 'ignore', 'pipe'],
        encoding: 'utf8',
      }),
      'mariadb (restore)',
    )
  }
  finally {
    closeSync(input)
  }
}
