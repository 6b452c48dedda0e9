// Projects the caller may see across their studios: all of a studio's for its owners and
// designers, their own for knitters.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return visibleProjects(user.id)
})
