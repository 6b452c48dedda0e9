import { idParams } from '#shared/validation/common'
import { machinePatch } from '#shared/validation/machines'
import { Machine } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Machine, id, 'designer', 'Machine')
  const body = await readValid(event, machinePatch)
  await row.update(machineColumns(body))
  return machineItem(row)
})
