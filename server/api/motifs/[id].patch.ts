import { idParams } from '#shared/validation/common'
import { motifPatchBody } from '#shared/validation/motifs'
import { motifRecord } from '../../db/motifs'

// Rename, redraw or (un)publish. New rows bring a new float report. Made from an old version
// (body `version`, else `If-Match`) it is a 409 with the current motif, and nothing is saved.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  await requireMotif(event, id, 'designer')
  const { version, name, published, rows } = await readValid(event, motifPatchBody)
  const saved = await updateMotif(id, expectedVersion(event, version), {
    ...(name !== undefined && { name }), ...(published !== undefined && { published }), ...(rows && motifRecord(rows)), updatedBy: user.id,
  })
  setVersionTag(event, saved.version)
  return saved
})
