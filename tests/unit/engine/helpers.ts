// Shared fast-check generators, brute-force references and helpers for the engine tests.
import fc from 'fast-check'
import { KnittingInputError } from '#shared/engine'
import type { Chart } from '#shared/engine'

/** A random chart; `bias` makes long runs likely so floats are interesting. */
export function chartArb(maxWidth = 12, maxHeight = 8): fc.Arbitrary<Chart> {
  return fc.record({
    width: fc.integer({ min: 1, max: maxWidth }),
    height: fc.integer({ min: 1, max: maxHeight }),
    density: fc.double({ min: 0, max: 1, noNaN: true }),
    seed: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: maxWidth * maxHeight, maxLength: maxWidth * maxHeight }),
  }).map(({ width, height, density, seed }) => {
    const cells = new Uint8Array(width * height)
    for (let i = 0; i < cells.length; i++) cells[i] = seed[i]! < density ? 1 : 0
    return { width, height, cells }
  })
}

/** The colours knitted in one chart row over the needles in work, read the slow way. */
export function knittedRow(chart: Chart, row: number, needles: number, offset: number): number[] {
  const out: number[] = []
  for (let i = 0; i < needles; i++) out.push(chart.cells[row * chart.width + ((offset + i) % chart.width)]!)
  return out
}

/** Lengths of the floats of `yarn` in a row: runs of the other colour, split at caught needles. */
export function floatRuns(colours: number[], yarn: number, caught: Set<number> = new Set()): number[] {
  const runs: number[] = []
  let run = 0
  colours.forEach((c, i) => {
    if (c !== yarn && !caught.has(i)) run++
    else {
      if (run > 0) runs.push(run)
      run = 0
    }
  })
  if (run > 0) runs.push(run)
  return runs
}

/** Run fn, expect a KnittingInputError and return it. */
export function inputError(fn: () => unknown): KnittingInputError {
  try { fn() }
  catch (e) {
    if (e instanceof KnittingInputError) return e
    throw new Error(`expected a KnittingInputError, got ${String(e)}`, { cause: e })
  }
  throw new Error('expected a KnittingInputError, nothing was thrown')
}
