import { motifToCsv, motifToJson } from '#shared/motif/file'
import { idParams } from '#shared/validation/common'
import { motifExportQuery } from '#shared/validation/motifs'
import { motifChart } from '../../../db/motifs'

// The motif as a file: our JSON format, CSV of 0/1, or a PNG picture (README, "Motif file format").
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { format } = queryValid(event, motifExportQuery)
  const { motif } = await requireMotif(event, id)
  const chart = motifChart(motif)
  const rows = motifDetail(motif).rows
  const base = motif.name.replace(/[^\w -]+/g, '').trim().replace(/\s+/g, '-').toLowerCase() || `motif-${motif.id}`
  setResponseHeaders(event, {
    'content-disposition': `attachment; filename="${base}.${format}"`,
    'x-content-type-options': 'nosniff',
  })
  if (format === 'png') {
    setResponseHeader(event, 'content-type', 'image/png')
    return chartPng(chart, Math.max(chart.width, chart.height) > 250 ? 4 : 8)
  }
  if (format === 'csv') {
    setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
    return motifToCsv(motif.name, rows)
  }
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return motifToJson(motif.name, rows)
})
