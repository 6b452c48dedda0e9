import { memberParams } from '#shared/validation/studios'

// Owners remove anyone; any member may leave (remove themselves). The last owner stays.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { studioId, userId } = paramsValid(event, memberParams)
  await studioMember(event, studioId, user.id === userId ? 'knitter' : 'owner')
  await removeMember(studioId, userId)
  // Removed by an owner: whatever that person's devices hold of the studio stops there.
  if (user.id !== userId) await endSessions({ userId }, 'removed from a studio')
  setResponseStatus(event, 204)
  return null
})
