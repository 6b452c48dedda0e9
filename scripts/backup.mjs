#!/usr/bin/env node
// `npm run backup [-- --database NAME] [--out FILE]`: a consistent dump of the private
// MariaDB's app database (default `floatwise`) to .data/backups/<database>-<UTC stamp>.sql.
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { dumpDatabase, utcStamp } from './lib/backup.mjs'
import { log } from './lib/log.mjs'
import { privateMariadb } from './lib/mariadb.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
const option = (name) => {
  const i = process.argv.indexOf(`--${name}`)
  return i > 0 ? process.argv[i + 1] : undefined
}
const database = option('database') ?? 'floatwise'
const file = resolve(option('out') ?? join(root, '.data/backups', `${database}-${utcStamp()}.sql`))

const server = privateMariadb(root)
const { startedHere } = await server.start()
try {
  const { bytes } = dumpDatabase(server, database, file)
  log(`Backup of ${database}: ${(bytes / 1024).toFixed(0)} KB`)
}
finally {
  if (startedHere) server.stop()
}
console.log(file) // last, alone on its line, for scripts
