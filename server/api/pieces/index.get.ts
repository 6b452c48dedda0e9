// The signed-in person's own pieces to knit, most recently knitted first.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return knitterPieces(user.id)
})
