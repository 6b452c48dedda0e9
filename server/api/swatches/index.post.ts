import { studioRef } from '#shared/validation/common'
import { swatchBody } from '#shared/validation/swatches'
import { Swatch } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { studioId } = await readValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  const body = await readValid(event, swatchBody)
  await checkSwatchRefs(studioId, body)
  const swatch = await Swatch.create(body)
  setResponseStatus(event, 201)
  return swatchItem(swatch)
})
