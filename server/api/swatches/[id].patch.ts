import { idParams } from '#shared/validation/common'
import { swatchPatch } from '#shared/validation/swatches'
import { Swatch } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Swatch, id, 'designer', 'Swatch')
  const body = await readValid(event, swatchPatch)
  await checkSwatchRefs(row.studioId, body)
  await row.update(body)
  return swatchItem(row)
})
