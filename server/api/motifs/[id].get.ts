import { idParams } from '#shared/validation/common'

export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { id } = paramsValid(event, idParams)
  const { motif } = await requireMotif(event, id)
  setVersionTag(event, motif.version)
  return motifDetail(motif)
})
