import { memberParams } from '../../../../../shared/validation/auth'

// Owners remove anyone; any member may leave (remove themselves). The last owner stays.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { studioId, userId } = paramsValid(event, memberParams)
  await requireStudioRole(event, studioId, user.id === userId ? 'knitter' : 'owner')
  await removeMember(studioId, userId)
  setResponseStatus(event, 204)
  return null
})
