import type { YarnStockItem } from '#shared/types/stock'
import { studioRef } from '#shared/validation/common'
import { Yarn } from '../../db/models'

// A studio's yarn stock, for every member (YarnListItem's fields plus studio, weight name and notes),
// each with what the published plans need of it and whether that is more than is on hand.
export default defineEventHandler(async (event): Promise<YarnStockItem[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioRef)
  await studioMember(event, studioId)
  const [rows, planned] = await Promise.all([Yarn.findAll({ where: { studioId }, order: [['name', 'ASC']] }), plannedGramsByYarn(studioId)])
  return rows.map((row) => {
    const item = yarnItem(row)
    const need = planned.get(row.id) ?? { grams: 0, plans: 0 }
    return { ...item, plannedGrams: need.grams, plannedIn: need.plans, low: need.grams > item.gramsOnHand }
  })
})
