import type { FloatVerdict } from '../knitting'

/** What a stored motif keeps about its floats, recomputed whenever its cells change. */
export interface MotifFloatReport {
  maxFloat: [number, number]
  verdict: FloatVerdict
  longRows: number[]
  unusedRows: [number[], number[]] // per yarn: chart rows where it knits no stitch
}
