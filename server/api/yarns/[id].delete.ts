import { idParams } from '#shared/validation/common'
import { Yarn } from '../../db/models'

// The owner's: swatches that named the yarn keep their measures; projects keep their own copy.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Yarn, id, 'owner', 'Yarn')
  await row.destroy()
  setResponseStatus(event, 204)
  return null
})
