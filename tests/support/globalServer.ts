import { mkdirSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
import { startAppServer } from './appServer'

// One built server per test project that needs it; files reach it through inject().
// Every project's server works on the one test database, so any of them may send a mail another
// project's test queued: they all keep mail in one folder of this run, where every test looks.
const runMailDir = join(tmpdir(), `floatwise-mail-run-${process.pid}`)

export default async function setup(project: TestProject) {
  mkdirSync(runMailDir, { recursive: true })
  const server = await startAppServer({}, { mailDir: runMailDir })
  project.provide('baseUrl', server.baseUrl)
  project.provide('mailDir', server.mailDir)
  project.provide('smtpUrl', server.smtpUrl)
  project.provide('picturesDir', server.picturesDir)
  return () => server.close()
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    mailDir: string
    smtpUrl: string
    picturesDir: string
  }
}
