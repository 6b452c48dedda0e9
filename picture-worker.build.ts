import { fileURLToPath } from 'node:url'
import type { Nitro } from 'nitropack/types'

// Pictures are read in worker threads (server/pictures/decodePool.ts). The worker is a second
// entry of Nitro's server bundle, .output/server/workers/picture-decoder.mjs beside index.mjs,
// so it runs the same engine code and the decoders Nitro traces into .output/server/node_modules.

const fromRoot = (path: string) => fileURLToPath(new URL(path, import.meta.url))
const workerEntry = fromRoot('./server/pictures/decodeWorker.ts')
// The app's modules the worker imports too. Rollup would put them in Nitro's own chunk (as
// dependencies of the app), and a worker importing that chunk would start the whole app.
const sharedWithWorker = [fromRoot('./shared/engine/'), fromRoot('./shared/motif/limits.ts')]

export function bundlePictureWorker(nitro: Nitro) {
  // The entry only answers its parent; Nitro's tree-shaking must not drop that.
  nitro.options.moduleSideEffects.push(workerEntry)
  nitro.hooks.hook('rollup:before', (_, rollup) => {
    rollup.input = { 'index': rollup.input as string, 'picture-decoder': workerEntry }
    rollup.output.entryFileNames = chunk => (chunk.name === 'index' ? 'index.mjs' : `workers/${chunk.name}.mjs`)
    const nitroChunks = rollup.output.manualChunks
    if (typeof nitroChunks !== 'function') throw new Error('picture worker: Nitro no longer names its chunks with a function')
    rollup.output.manualChunks = (id, meta) => (sharedWithWorker.some(path => id.startsWith(path)) ? 'engine' : nitroChunks(id, meta))
    const plugins = Array.isArray(rollup.plugins) ? rollup.plugins : []
    rollup.plugins = [...plugins, {
      name: 'picture-worker-stays-small',
      generateBundle(_options, bundle) {
        // Fails the build rather than shipping a worker that boots the app in every thread.
        const seen = new Set<string>()
        const visit = (file: string) => {
          if (seen.has(file)) return
          seen.add(file)
          if (file.startsWith('chunks/nitro/'))
            this.error(`the picture worker imports ${file}: move what it needs out of Nitro's chunk (picture-worker.build.ts)`)
          const chunk = bundle[file]
          if (chunk?.type === 'chunk') chunk.imports.forEach(visit)
        }
        visit('workers/picture-decoder.mjs')
      },
    }]
  })
}
