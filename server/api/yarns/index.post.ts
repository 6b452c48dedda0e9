import { studioRef } from '#shared/validation/common'
import { yarnBody } from '#shared/validation/yarns'
import { Yarn } from '../../db/models'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { studioId } = await readValid(event, studioRef)
  await studioMember(event, studioId, 'designer')
  const body = await readValid(event, yarnBody)
  const yarn = await Yarn.create(body)
  setResponseStatus(event, 201)
  return yarnItem(yarn)
})
