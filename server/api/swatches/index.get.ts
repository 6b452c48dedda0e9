import type { SwatchItem } from '#shared/types/stock'
import { studioRef } from '#shared/validation/common'
import { Swatch } from '../../db/models'

// A studio's swatches with their gauge, newest first, for every member.
export default defineEventHandler(async (event): Promise<SwatchItem[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioRef)
  await studioMember(event, studioId)
  const rows = await Swatch.findAll({ where: { studioId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] })
  return rows.map(swatchItem)
})
