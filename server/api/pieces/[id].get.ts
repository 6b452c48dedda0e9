import { idParams } from '#shared/validation/common'

// One piece with the timeline the knit view follows.
export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { id } = paramsValid(event, idParams)
  const { piece, project } = await requirePiece(event, id)
  return pieceDetail(piece, project)
})
