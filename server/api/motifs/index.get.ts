import type { MotifListItem } from '../../../shared/types/studio'
import { studioQuery } from '../../../shared/validation/library'
import { Motif } from '../../db/models'

// A studio's motifs: knitters see the published ones, designers and owners all of them.
export default defineEventHandler(async (event): Promise<MotifListItem[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioQuery)
  const { membership } = await requireStudioRole(event, studioId)
  const rows = await Motif.findAll({
    where: { studioId, ...(membership.role === 'knitter' ? { published: true } : {}) },
    attributes: { exclude: ['cells'] },
    order: [['name', 'ASC']],
  })
  return rows.map(m => ({
    id: m.id, name: m.name, width: m.width, height: m.height, published: m.published,
    verdict: m.floatReport?.verdict ?? null, maxFloat: m.floatReport?.maxFloat ?? null, updatedAt: m.updatedAt.toISOString(),
  }))
})
