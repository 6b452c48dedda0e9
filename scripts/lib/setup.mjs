import { join } from 'node:path'
import { log } from './log.mjs'
import { run } from './run.mjs'
import { privateMariadb } from './mariadb.mjs'
import { keptSecret } from './secrets.mjs'
import { typescriptRun } from './typescript.mjs'

/**
 * Everything both commands need before the app runs: a database (the private MariaDB
 * unless DATABASE_URL is given), migrations and the demo studio. Returns the app's
 * environment and a function that stops what was started here.
 */
export async function prepareDatabase(root, { database, fresh = false }) {
  const env = {}
  let stop = () => {}
  if (process.env.DATABASE_URL && !fresh) {
    log('Using the MariaDB at DATABASE_URL (no private server started)')
    env.DATABASE_URL = process.env.DATABASE_URL
  }
  else {
    const db = privateMariadb(root)
    const { startedHere } = await db.start()
    if (startedHere) stop = () => db.stop()
    const password = keptSecret(join(root, '.data/db-password'))
    env.DATABASE_URL = db.ensureDatabase(database, 'floatwise', password, { fresh })
    log(`Database ${database} ready on 127.0.0.1:${db.port}${fresh ? ' (created fresh)' : ''}`)
  }
  env.NUXT_SESSION_PASSWORD = keptSecret(join(root, '.data/session-password'), process.env.NUXT_SESSION_PASSWORD)
  const dbScript = typescriptRun(root, 'scripts/db.ts')
  run(process.execPath, [...dbScript.args, 'migrate'], { cwd: root, env: { ...process.env, ...env, ...dbScript.env } })
  run(process.execPath, [...dbScript.args, 'seed'], { cwd: root, env: { ...process.env, ...env, ...dbScript.env } })
  return { env, stop }
}
