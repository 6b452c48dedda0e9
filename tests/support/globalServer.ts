import type { TestProject } from 'vitest/node'
import { startAppServer } from './appServer'

// One built server per test project that needs it; files reach it through inject().
export default async function setup(project: TestProject) {
  const server = await startAppServer()
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
