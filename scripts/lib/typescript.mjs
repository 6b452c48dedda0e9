import { join } from 'node:path'

/**
 * Node arguments and environment that run one of the project's TypeScript files outside Nuxt
 * (jiti), with Nuxt's `#shared` alias so server code imports shared/ as it does in the app.
 */
export function typescriptRun(root, file) {
  return {
    args: ['--import', 'jiti/register', join(root, file)],
    env: { JITI_ALIAS: JSON.stringify({ '#shared': join(root, 'shared') }) },
  }
}
