// "Sign out on every other device": ends all the person's sessions but this one.
export default defineEventHandler(async (event) => {
  const { id } = await requireUser(event)
  const ended = await endSessions({ userId: id, except: await currentSid(event) }, 'signed out everywhere')
  return { ended }
})
