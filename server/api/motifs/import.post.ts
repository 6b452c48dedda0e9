import { motifFromCsv, motifFromJson, MotifFileError } from '#shared/motif/file'
import { studioRef } from '#shared/validation/common'
import { chartRows, motifImportBody } from '#shared/validation/motifs'
import { Motif } from '../../db/models'
import { motifRecord } from '../../db/motifs'

// A new motif (a draft) from one of our files: JSON or CSV text (README, "Motif file format").
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { studioId } = await readValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  const body = await readValid(event, motifImportBody)
  let file: { name?: string; rows: string[] }
  try { file = body.format === 'csv' ? motifFromCsv(body.content) : motifFromJson(body.content) }
  catch (e) {
    if (e instanceof MotifFileError) throw fieldError('content', e.message)
    throw e
  }
  const rows = chartRows.safeParse(file.rows)
  if (!rows.success) throw fieldError('content', rows.error.issues[0]!.message)
  const name = body.name ?? (file.name?.trim().slice(0, 120) || 'Imported motif')
  const motif = await Motif.create({
    studioId, name, published: false, createdBy: user.id, updatedBy: user.id, ...motifRecord(rows.data),
  })
  setResponseStatus(event, 201)
  return loadMotifDetail(motif.id)
})
