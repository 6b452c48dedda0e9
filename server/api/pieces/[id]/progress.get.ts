import { idParams } from '#shared/validation/common'

// The piece's synced place only: cheap enough to ask often.
export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { id } = paramsValid(event, idParams)
  const { piece } = await requirePiece(event, id, { withTimeline: false })
  return pieceProgress(piece)
})
