import { analyseFloats, chartFromRows, type Chart } from '#shared/engine'
import type { MotifFloatReport } from '#shared/types/motif'
import type { Motif } from './models'

// A motif's stored form. Plain module (no Nitro auto-imports) so the API, the demo seed and
// the test fixtures all store motifs the same way.

/** Repeats laid side by side for the stored float report: floats run across repeat boundaries. */
export const REPORT_REPEATS = 4

/** The stored form of a chart: its cells ('0'/'1' per cell, row 0 first) and its float report. */
export function chartRecord(chart: Chart) {
  const report = analyseFloats(chart, { needles: chart.width * REPORT_REPEATS })
  const floatReport: MotifFloatReport = { maxFloat: report.maxFloat, verdict: report.verdict, longRows: report.longRows, unusedRows: report.unusedRows }
  return {
    width: chart.width,
    height: chart.height,
    cells: Array.from(chart.cells).join(''),
    floatReport,
    verdict: report.verdict,
    longestFloat: Math.max(...report.maxFloat),
  }
}

/** The stored form of chart rows in chartFromRows format (throws its KnittingInputError). */
export function motifRecord(rows: string[]) {
  return chartRecord(chartFromRows(rows))
}

/** A stored motif's chart. */
export function motifChart(motif: Pick<Motif, 'width' | 'height' | 'cells'>): Chart {
  const cells = new Uint8Array(motif.width * motif.height)
  for (let i = 0; i < cells.length; i++) cells[i] = motif.cells.charCodeAt(i) === 49 ? 1 : 0
  return { width: motif.width, height: motif.height, cells }
}
