import { idParams } from '#shared/validation/common'
import { Machine } from '../../db/models'

// The owner's: swatches, plans and projects that named the machine keep going without it.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Machine, id, 'owner', 'Machine')
  await row.destroy()
  setResponseStatus(event, 204)
  return null
})
