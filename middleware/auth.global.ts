// Sends people who are not signed in to the sign-in page. This only spares them a
// broken screen: every permission is checked again by the server.
const publicPages = ['/login', '/register', '/forgot-password', '/reset-password', '/confirm-address']

let checked = false

export default defineNuxtRouteMiddleware(async (to) => {
  const isPublic = publicPages.includes(to.path) || to.path.startsWith('/invitations/')
  const account = useAccountStore()
  // Once per app load; later navigations trust what we know (the server checks every call).
  if (!checked) {
    checked = true
    await account.refresh()
  }
  else if (!account.me) await account.refresh()
  if (!account.me && !isPublic) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  if (account.me && (to.path === '/login' || to.path === '/register')) return navigateTo('/')
})
