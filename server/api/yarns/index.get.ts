import type { YarnItem } from '../../../shared/types/plan'
import { studioQuery } from '../../../shared/validation/library'
import { Yarn } from '../../db/models'

// A studio's yarn stock, for every member (YarnListItem's fields plus studio, weight name and notes).
export default defineEventHandler(async (event): Promise<YarnItem[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioQuery)
  await requireStudioRole(event, studioId)
  const rows = await Yarn.findAll({ where: { studioId }, order: [['name', 'ASC']] })
  return rows.map(yarnItem)
})
