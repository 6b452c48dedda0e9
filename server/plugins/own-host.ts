import type { H3Event } from 'h3'

// Every request must name one of our hosts (server/utils/ownHosts.ts), reads included: a
// DNS-rebinding page could otherwise read the answers (the app shell, a signed-in knitter's
// API answers) under a name of its own. The check sits first in h3's stack, because Nitro
// serves the public files before any server middleware runs. It answers by itself rather
// than through the error handlers: Nuxt's error page is rendered by a second, internal
// request carrying the same foreign Host.
const refusalHeaders = {
  'content-type': 'application/json',
  'cache-control': 'no-store',
  'x-content-type-options': 'nosniff',
}

function refuse(event: H3Event, statusCode: number, statusMessage: string, message: string) {
  setResponseStatus(event, statusCode, statusMessage)
  setResponseHeaders(event, refusalHeaders)
  return { error: true, statusCode, statusMessage, message }
}

export default defineNitroPlugin((nitroApp) => {
  // The prerenderer renders the shell through internal requests that name no host.
  if (import.meta.prerender) return
  // Its host is one of ours: a bad NUXT_APP_URL shows at start, not as a 500 on every request.
  const { appUrl } = useRuntimeConfig()
  if (!URL.canParse(appUrl)) throw new Error(`NUXT_APP_URL is not a URL: ${appUrl}`)
  nitroApp.h3App.stack.unshift({
    route: '',
    handler: defineEventHandler((event) => {
      const origin = requestOrigin(event)
      if (!origin) return refuse(event, 400, 'Bad Request', 'The Host header does not name a host')
      if (!isOwnHostname(origin.hostname)) {
        return refuse(
          event,
          421,
          'Misdirected Request',
          `This server does not answer for ${origin.hostname}: open it at its own address, or add the name to NUXT_ALLOWED_HOSTS`,
        )
      }
    }),
  })
})
