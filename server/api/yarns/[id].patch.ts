import { idParams } from '#shared/validation/common'
import { yarnPatch } from '#shared/validation/yarns'
import { Yarn } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { row } = await requireStudioRow(event, Yarn, id, 'designer', 'Yarn')
  const body = await readValid(event, yarnPatch)
  await row.update(body)
  return yarnItem(row)
})
