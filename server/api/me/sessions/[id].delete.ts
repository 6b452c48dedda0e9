import { idParams } from '#shared/validation/common'

// Ends one of the person's own sessions (another person's id is simply not found).
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const ended = await endSessions({ id, userId: user.id }, 'signed out from another device')
  if (!ended) throw createError({ statusCode: 404, message: 'Session not found (it may have ended already)' })
  setResponseStatus(event, 204)
  return null
})
