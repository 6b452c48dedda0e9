// Signing out through either route (ours or nuxt-auth-utils' DELETE /api/_auth/session) ends
// the session's row, so a copy of the cookie is worthless afterwards.
export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session) => {
    if (typeof session.sid === 'string') await endSessions({ sid: session.sid }, 'signed out')
  })
})
