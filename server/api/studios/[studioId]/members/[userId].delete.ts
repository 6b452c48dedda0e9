import { memberParams } from '../../../../../shared/validation/auth'

// Owners remove anyone; any member may leave (remove themselves). The last owner stays.
export default defineEventHandler(async (event) => {
  const { studioId, userId } = await paramsValid(event, memberParams)
  const user = await requireUser(event)
  await requireStudioRole(event, studioId, user.id === userId ? 'knitter' : 'owner')
  await removeMember(studioId, userId)
  setResponseStatus(event, 204)
  return null
})
