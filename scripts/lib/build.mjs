import { createHash } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { log } from './log.mjs'
import { run } from './run.mjs'

// Everything that goes into .output; tests/ and scripts/ do not.
const inputs = [
  'app.vue',
  'error.vue',
  'nuxt.config.ts',
  'pwa.config.ts',
  'security-headers.ts',
  'inline-scripts.ts',
  'picture-worker.build.ts',
  'tailwind.config.ts',
  'package-lock.json',
  'tsconfig.json',
  'spa-loading-template.html',
  'modules',
  'pages',
  'components',
  'composables',
  'stores',
  'layouts',
  'middleware',
  'plugins',
  'assets',
  'public',
  'server',
  'shared',
  'offline',
  'service-worker',
]

function hashInputs(root) {
  const hash = createHash('sha256')
  const visit = (path) => {
    if (!existsSync(path)) return
    if (statSync(path).isDirectory()) {
      for (const name of readdirSync(path).sort()) visit(join(path, name))
    }
    else {
      hash.update(path.slice(root.length)).update(readFileSync(path))
    }
  }
  for (const input of inputs) visit(join(root, input))
  return hash.digest('hex')
}

/** `nuxt build` unless .output was built from exactly these sources. */
export function ensureBuild(root) {
  const marker = join(root, '.output/.floatwise-build-hash')
  const hash = hashInputs(root)
  if (existsSync(marker) && readFileSync(marker, 'utf8').trim() === hash) return
  log('Building the app (nuxt build)…')
  run(join(root, 'node_modules/.bin/nuxt'), ['build'], { cwd: root, env: { ...process.env, NODE_ENV: 'production' } })
  writeFileSync(marker, hash + '\n')
}
