import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { startMailFake } from '../../scripts/lib/mail-fake.mjs'

export const root = process.env.FLOATWISE_ROOT ?? join(import.meta.dirname, '../..')

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer()
    s.once('error', reject)
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number }
      s.close(() => resolve(port))
    })
  })
}

/**
 * The built server (.output) on a free port against DATABASE_URL, with its own mail fake — or,
 * with `mail`, the mail fake of another server on the same database: every server sends what the
 * shared mail queue holds, so a second server with a fake of its own would carry off mail the
 * first one's tests wait for. `mailDir`: a fake of its own that keeps mail in that folder (the
 * test projects' servers all keep theirs in one, as they share one database and its queue).
 */
export async function startAppServer(
  extraEnv: Record<string, string> = {}, shared: { mail?: { url: string; dir: string }; mailDir?: string } = {},
) {
  if (!process.env.DATABASE_URL && !extraEnv.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the tests through `npm test`')
  const mailDir = shared.mail?.dir ?? shared.mailDir ?? mkdtempSync(join(tmpdir(), 'floatwise-mail-'))
  // Each server keeps motif pictures in a folder of its own, so tests can count what it stored.
  const picturesDir = mkdtempSync(join(tmpdir(), 'floatwise-pictures-'))
  const mail = shared.mail ? { url: shared.mail.url, close: async () => {} } : await startMailFake(mailDir)
  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  const env = {
    ...process.env,
    PORT: String(port),
    HOST: '127.0.0.1',
    NODE_ENV: 'production',
    NUXT_SMTP_URL: mail.url,
    NUXT_APP_URL: baseUrl,
    NUXT_TRUST_PROXY: 'true', // lets each test sign in from its own address (see throttle.ts)
    NUXT_PICTURES_DIR: picturesDir,
    ...extraEnv,
  }
  let child: ChildProcess | undefined
  let output = ''
  async function start() {
    child = spawn(process.execPath, [join(root, '.output/server/index.mjs')], { env, stdio: ['ignore', 'pipe', 'pipe'] })
    child.stdout!.on('data', (d) => { output += d })
    child.stderr!.on('data', (d) => { output += d })
    for (let i = 0; i < 200; i++) {
      if (child.exitCode !== null) throw new Error(`The app server exited:\n${output}`)
      try {
        if ((await fetch(`${baseUrl}/api/health`)).ok) return
      }
      catch { /* not listening yet */ }
      await new Promise(r => setTimeout(r, 50))
    }
    throw new Error(`The app server did not answer:\n${output}`)
  }
  async function stop(signal: NodeJS.Signals = 'SIGTERM') {
    if (!child || child.exitCode !== null) return
    const exited = new Promise(r => child!.once('exit', r))
    child.kill(signal)
    await exited
  }
  await start()
  return {
    baseUrl, mailDir, picturesDir, port, smtpUrl: mail.url,
    restart: async () => { await stop(); await start() },
    /** A crash rather than a shutdown: requests in flight get no answer (the soak plays it). */
    kill: () => stop('SIGKILL'),
    start,
    pid: () => child?.pid,
    close: async () => { await stop(); await mail.close() },
    output: () => output,
  }
}
