import type { MachineItem } from '#shared/types/stock'
import { studioRef } from '#shared/validation/common'
import { Machine } from '../../db/models'

// A studio's machines, for every member.
export default defineEventHandler(async (event): Promise<MachineItem[]> => {
  await requireUser(event)
  const { studioId } = queryValid(event, studioRef)
  await studioMember(event, studioId)
  const rows = await Machine.findAll({ where: { studioId }, order: [['name', 'ASC'], ['id', 'ASC']] })
  return rows.map(machineItem)
})
