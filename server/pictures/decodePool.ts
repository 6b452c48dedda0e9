import { availableParallelism } from 'node:os'
import { Worker } from 'node:worker_threads'
import type { PictureChartJob, PictureChartResult } from './chartFromPicture'
import { createDecodeQueue } from './decodeQueue'
import type { DecodeAnswer } from './decodeWorker'

// Pictures are read in worker threads, never on the thread that answers requests: decoding
// and shrinking a 4-megapixel picture takes a few hundred milliseconds of CPU, during which
// the server would answer nobody. Workers are kept for the next picture (starting one costs
// more than reading a small picture) and stopped after a minute without work, which also hands
// back what the decoders grew to (the WebP decoder's WebAssembly memory never shrinks).

/** One core stays with the request thread; at most two pictures are read at once. */
export const decodeQueue = createDecodeQueue({
  slots: Math.min(2, Math.max(1, availableParallelism() - 1)),
  waitingPerUser: 2, // the picture page sends a new preview while the last may still be read
  waitingInAll: 20,
})

/** The picture took longer than the time limit; its worker was stopped. */
export class DecodeTimeoutError extends Error {}
/** The worker failed: `started` says whether it got as far as the picture. */
export class DecoderFailedError extends Error {
  constructor(message: string, readonly started: boolean) { super(message) }
}
/** The worker's own answer for a picture it could not make a chart of. */
export class DecodeRefusal extends Error {
  constructor(readonly answer: Extract<DecodeAnswer, { kind: 'unreadable' | 'refused' }>) { super(answer.message) }
}

// Nitro bundles decodeWorker.ts as a second entry beside the server's index.mjs
// (picture-worker.build.ts). In the bundle, import.meta.url of every chunk is the entry's URL,
// but only once the entry has run: read it when a picture comes, not when this module loads.
const workerFile = () => new URL('./workers/picture-decoder.mjs', import.meta.url)
// A new worker loads the decoders (and compiles the WebP decoder) before the clock starts.
const startupAllowanceMs = 10_000
const idleMs = 60_000

const idle = new Map<Worker, NodeJS.Timeout>() // workers waiting for a picture, with their retirement

function takeWorker() {
  const [kept] = idle
  if (kept) {
    clearTimeout(kept[1])
    idle.delete(kept[0])
    return kept[0]
  }
  const worker = new Worker(workerFile(), { resourceLimits: { maxOldGenerationSizeMb: 256 } })
  worker.unref() // never what keeps the server process alive
  worker.on('exit', () => idle.delete(worker))
  return worker
}

function keepWorker(worker: Worker) {
  idle.set(worker, setTimeout(() => void worker.terminate(), idleMs).unref())
}

/** The chart of one picture, made in a worker thread that is stopped after `timeoutMs` of reading. */
export function chartInWorker(job: PictureChartJob, timeoutMs: number): Promise<PictureChartResult> {
  const worker = takeWorker()
  return new Promise((resolve, reject) => {
    let started = false
    let timer: NodeJS.Timeout
    const stopAfter = (ms: number, error: () => Error) => setTimeout(() => {
      done(false)
      reject(error())
    }, ms)
    const onMessage = (answer: DecodeAnswer) => {
      if (answer.kind === 'started') {
        started = true
        clearTimeout(timer)
        timer = stopAfter(timeoutMs, () => new DecodeTimeoutError(`reading took longer than ${timeoutMs} ms`))
        return
      }
      done(true)
      if (answer.kind === 'chart') resolve(answer.result)
      else reject(new DecodeRefusal(answer))
    }
    const onError = (error: Error) => {
      done(false)
      reject(new DecoderFailedError(error.message, started))
    }
    const onExit = (code: number) => {
      done(false)
      reject(new DecoderFailedError(`the picture decoder exited (${code})`, started))
    }
    // A worker that answered is kept for the next picture; any other is stopped.
    function done(healthy: boolean) {
      clearTimeout(timer)
      worker.off('message', onMessage).off('error', onError).off('exit', onExit)
      if (healthy) keepWorker(worker)
      else void worker.terminate()
    }
    timer = stopAfter(startupAllowanceMs, () => new DecoderFailedError('the picture decoder did not start', false))
    worker.on('message', onMessage).on('error', onError).on('exit', onExit)
    worker.postMessage(job)
  })
}
