import { idParams } from '#shared/validation/common'
import { Swatch } from '../../db/models'

// Designers may delete swatches they measured; plans that used it lose their gauge (warned).
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Swatch, id, 'designer', 'Swatch')
  await row.destroy()
  setResponseStatus(event, 204)
  return null
})
