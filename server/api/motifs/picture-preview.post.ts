import type { PicturePreview } from '#shared/types/motif'
import { studioRef } from '#shared/validation/common'
import { picturePreviewFields } from '#shared/validation/motifs'

// The chart a picture would make (multipart/form-data, like from-picture); nothing is stored.
export default defineEventHandler(async (event): Promise<PicturePreview> => {
  const user = await requireUser(event)
  const { fields, file } = await readPictureForm(event)
  const { studioId } = inputValid(studioRef, fields)
  await studioMember(event, studioId, 'designer')
  const form = inputValid(picturePreviewFields, fields)
  const { chart, threshold, otsu, rows } = await pictureChart(event, user.id, requirePictureFile(file), form)
  return { width: chart.width, height: chart.height, threshold, otsu, rows }
})
