import { parentPort } from 'node:worker_threads'
import { KnittingInputError } from '#shared/engine'
import { chartFromPicture, UnreadablePictureError } from './chartFromPicture'
import type { PictureChartJob, PictureChartResult } from './chartFromPicture'

// A worker thread that reads pictures, one at a time, for decodePool.ts. Nitro bundles it as
// its own entry, .output/server/workers/picture-decoder.mjs (picture-worker.build.ts). For each
// picture it says when it starts, so the time limit counts only the reading, then answers.

export type DecodeAnswer
  = | { kind: 'started' }
    | { kind: 'chart'; result: PictureChartResult }
    | { kind: 'unreadable'; message: string }
    | { kind: 'refused'; field: string; message: string }

const port = parentPort!
const send = (answer: DecodeAnswer, transfer: ArrayBuffer[] = []) => port.postMessage(answer, transfer)

port.on('message', (job: PictureChartJob) => {
  send({ kind: 'started' })
  try {
    const result = chartFromPicture(job)
    send({ kind: 'chart', result }, [result.chart.cells.buffer as ArrayBuffer])
  }
  catch (e) {
    if (e instanceof UnreadablePictureError) send({ kind: 'unreadable', message: e.message })
    else if (e instanceof KnittingInputError) send({ kind: 'refused', field: e.field ?? 'picture', message: e.message })
    else throw e // the worker dies with it; the pool answers for it and starts another
  }
})
