export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return { user, studios: await studiosOf(user.id) }
})
