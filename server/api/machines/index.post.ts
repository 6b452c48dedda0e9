import { studioRef } from '#shared/validation/common'
import { machineBody } from '#shared/validation/machines'
import { Machine } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { studioId } = await readValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  const body = await readValid(event, machineBody)
  const machine = await Machine.create(machineColumns(body))
  setResponseStatus(event, 201)
  return machineItem(machine)
})
