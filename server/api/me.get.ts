import { User } from '../db/models'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const row = await User.findByPk(user.id, { attributes: ['emailConfirmedAt'] })
  return { user, emailConfirmed: !!row?.emailConfirmedAt, studios: await studiosOf(user.id) }
})
