import type { YarnListItem } from '../../../shared/types/studio'
import { studioQuery } from '../../../shared/validation/library'
import { Yarn } from '../../db/models'

// A studio's yarn stock, for every member.
export default defineEventHandler(async (event): Promise<YarnListItem[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioQuery)
  await requireStudioRole(event, studioId)
  const rows = await Yarn.findAll({ where: { studioId }, order: [['name', 'ASC']] })
  return rows.map(y => ({ id: y.id, name: y.name, hex: y.hex, weightCategory: y.weightCategory, metresPer100g: y.metresPer100g, gramsOnHand: y.gramsOnHand }))
})
