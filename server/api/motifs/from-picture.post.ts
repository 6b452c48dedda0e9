import { studioRef } from '#shared/validation/common'
import { pictureMotifFields } from '#shared/validation/motifs'
import { chartRecord } from '../../db/motifs'

// A new motif from an uploaded picture (multipart/form-data), keeping the original.
// Everything is checked and converted before anything is written.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { fields, file } = await readPictureForm(event)
  const { studioId } = inputValid(studioRef, fields)
  await studioMember(event, studioId, 'designer')
  const form = inputValid(pictureMotifFields, fields)
  const picture = requirePictureFile(file)
  const { chart } = await pictureChart(event, user.id, picture, form)
  const id = await insertPictureMotif({
    studioId, name: form.name, published: false, createdBy: user.id, updatedBy: user.id, ...chartRecord(chart),
  }, picture)
  setResponseStatus(event, 201)
  return loadMotifDetail(id)
})
