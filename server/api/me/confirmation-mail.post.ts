import { User } from '../../db/models'

// Sends the address confirmation link again (limited like every mail: see mailQueue.ts).
export default defineEventHandler(async (event) => {
  const { id } = await requireUser(event)
  const user = (await User.findByPk(id))!
  if (user.emailConfirmedAt) throw createError({ statusCode: 409, message: `${user.email} is already confirmed` })
  await queueAddressConfirmation(event, user)
  setResponseStatus(event, 202)
  return { message: `A new link is on its way to ${user.email}.` }
})
