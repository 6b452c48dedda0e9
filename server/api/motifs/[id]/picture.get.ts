import { idParams } from '#shared/validation/common'

// The original picture a motif was made from, byte for byte, to whoever may see the motif.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { motif } = await requireMotif(event, id)
  const bytes = motif.pictureType ? await readPicture(motif.id) : null
  if (!bytes || !motif.pictureType) throw createError({ statusCode: 404, message: 'This motif has no picture' })
  setResponseHeaders(event, {
    'content-type': motif.pictureType,
    'content-length': bytes.length,
    'x-content-type-options': 'nosniff',
    'content-disposition': 'inline',
    // Like every personal answer: a shared tablet's browser cache must not keep it after sign-out.
    'cache-control': 'no-store',
  })
  return bytes
})
