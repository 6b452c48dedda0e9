#!/usr/bin/env node
// `npm run restore -- FILE [--into NAME] [--replace]`: loads a dump made by `npm run backup`
// into a NEW database (default floatwise_restored_<UTC stamp>), never over an existing one
// unless --replace is given. To put the app on it, stop the app and restore with
// `--into floatwise --replace`.
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { restoreDatabase, utcStamp } from './lib/backup.mjs'
import { fail, log } from './lib/log.mjs'
import { privateMariadb } from './lib/mariadb.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
const args = process.argv.slice(2)
const option = (name) => {
  const i = args.indexOf(`--${name}`)
  return i >= 0 ? args[i + 1] : undefined
}
const file = args.find((a, i) => !a.startsWith('--') && args[i - 1] !== '--into')
if (!file) fail('Usage: npm run restore -- FILE [--into NAME] [--replace]')
const database = option('into') ?? `floatwise_restored_${utcStamp().toLowerCase()}`

const server = privateMariadb(root)
const { startedHere } = await server.start()
try {
  restoreDatabase(server, resolve(file), database, { replace: args.includes('--replace') })
  log(`Restored ${resolve(file)} into database ${database} on 127.0.0.1:${server.port}`)
}
catch (error) {
  console.error(`[floatwise] ${error.message}`)
  process.exitCode = 1
}
finally {
  if (startedHere) server.stop()
}
if (!process.exitCode) console.log(database) // last, alone on its line, for scripts
