import { memberParams, roleChangeBody } from '#shared/validation/studios'

export default defineEventHandler(async (event) => {
  await requireUser(event) // 401 before anything about the request is checked
  const { studioId, userId } = paramsValid(event, memberParams)
  await studioMember(event, studioId, 'owner')
  const { role } = await readValid(event, roleChangeBody)
  const member = await changeMemberRole(studioId, userId, role)
  return { userId: member.userId, role: member.role }
})
