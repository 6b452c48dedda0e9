import { idParams } from '#shared/validation/common'
import { Swatch } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Swatch, id, 'knitter', 'Swatch')
  return swatchItem(row)
})
