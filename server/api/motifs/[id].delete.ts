import { idParams } from '#shared/validation/common'

// Projects made from the motif keep their own copy of the chart (their motif link is cleared).
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { motif } = await requireMotif(event, id, 'designer')
  await motif.destroy()
  if (motif.pictureType) {
    await removePicture(motif.id).catch(e => console.error(`motif ${motif.id}: its picture could not be removed`, e))
  }
  setResponseStatus(event, 204)
  return null
})
