import { memberParams, roleChangeBody } from '../../../../../shared/validation/auth'

export default defineEventHandler(async (event) => {
  const { studioId, userId } = await paramsValid(event, memberParams)
  await requireStudioRole(event, studioId, 'owner')
  const { role } = await readValid(event, roleChangeBody)
  const member = await changeMemberRole(studioId, userId, role)
  return { userId: member.userId, role: member.role }
})
