// A sealed cookie is only as good as its session row: one that was ended (or that carries no
// session id, from before sessions were kept) is taken off the request here, so every route,
// nuxt-auth-utils' own /api/_auth/session included, sees a signed-out caller.
const sessionName = 'nuxt-session'
const sessionHeader = `x-${sessionName}-session`

export default defineEventHandler(async (event) => {
  const cookie = getRequestHeader(event, 'cookie')
  const header = getRequestHeader(event, sessionHeader)
  if (!cookie?.includes(`${sessionName}=`) && !header) return
  const session = await getUserSession(event)
  if (!session.user) return
  if (await sessionIsLive(session.sid, session.user.id)) return

  if (event.context.sessions) Reflect.deleteProperty(event.context.sessions, sessionName)
  const headers = event.node.req.headers
  Reflect.deleteProperty(headers, sessionHeader)
  if (cookie) {
    headers.cookie = cookie.split(';').filter(part => part.trim().split('=')[0] !== sessionName).join(';')
  }
  deleteCookie(event, sessionName, { path: '/', secure: true, httpOnly: true, sameSite: 'lax' })
})
