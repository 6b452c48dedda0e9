#!/usr/bin/env node
// `npm start`: set everything up on this machine and serve Floatwise on http://localhost:3000.
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { ensureDependencies } from './lib/deps.mjs'
import { log } from './lib/log.mjs'

const root = join(dirname(fileURLToPath(import.meta.url)), '..')
ensureDependencies(root)

// Loaded after the dependencies are in place.
const { prepareDatabase } = await import('./lib/setup.mjs')
const { ensureBuild } = await import('./lib/build.mjs')
const { startMailFake, startMailViewer } = await import('./lib/mail-fake.mjs')
const { start } = await import('./lib/run.mjs')

const { assertPortFree } = await import('./lib/ports.mjs')

const port = Number(process.env.PORT ?? 3000)
const mailPort = Number(process.env.FLOATWISE_MAIL_PORT ?? 2526)
const mailViewPort = Number(process.env.FLOATWISE_MAIL_VIEW_PORT ?? 2527)
await assertPortFree(port, 'the app', 'PORT')
if (!process.env.SMTP_URL) {
  await assertPortFree(mailPort, 'the local mail fake', 'FLOATWISE_MAIL_PORT')
  await assertPortFree(mailViewPort, 'the local mail fake\'s inbox viewer', 'FLOATWISE_MAIL_VIEW_PORT')
}
const { env, stop: stopDatabase } = await prepareDatabase(root, { database: 'floatwise' })
try {
  ensureBuild(root)
}
catch (error) {
  stopDatabase() // a failed build leaves nothing running behind it
  throw error
}

let mail, mailViewer
if (process.env.SMTP_URL) {
  env.NUXT_SMTP_URL = process.env.SMTP_URL
}
else {
  mail = await startMailFake(join(root, '.data/mail'), mailPort)
  mailViewer = await startMailViewer(join(root, '.data/mail'), mailViewPort)
  env.NUXT_SMTP_URL = mail.url
}

const appUrl = process.env.NUXT_APP_URL ?? `http://localhost:${port}`
const server = start(process.execPath, [join(root, '.output/server/index.mjs')], {
  cwd: root,
  env: { ...process.env, ...env, PORT: String(port), NUXT_APP_URL: appUrl },
})

log(`Floatwise is starting on ${appUrl}`)
log('Demo sign-ins (password floatwise-demo): owner@floatwise.test, designer@floatwise.test, knitter@floatwise.test')
if (mailViewer) log(`Mail goes to the local fake: read it on this computer only, at ${mailViewer.url}`)
log('Press Ctrl-C to stop the app and the database.')

let stopping = false
async function shutdown(code = 0) {
  if (stopping) return
  stopping = true
  server.kill('SIGTERM')
  await new Promise(resolve => server.exitCode !== null ? resolve() : server.once('exit', resolve))
  await mail?.close()
  await mailViewer?.close()
  stopDatabase()
  log('Stopped.')
  process.exit(code)
}
process.on('SIGINT', () => shutdown(0))
process.on('SIGTERM', () => shutdown(0))
server.on('exit', (code) => {
  if (!stopping) { log(`The app server stopped (exit ${code}).`); shutdown(code ?? 1) }
})
