import { createError, send, setResponseHeader, setResponseHeaders, setResponseStatus } from 'h3'
import { defineNitroErrorHandler } from 'nitropack/runtime'
import { databaseDownMessage, databaseRetryAfterSeconds, isDatabaseUnavailable } from '../db/unavailable'

// Runs before the other error handlers (nuxt.config.ts): a database that is not answering is a
// 503 the caller can wait out, never a 500. Any other error falls through to them unchanged.
export default defineNitroErrorHandler(async (error, event, { defaultHandler }) => {
  if (!isDatabaseUnavailable(error)) return
  console.warn(`[database unavailable] ${event.method} ${event.path}: ${(error.cause as Error | undefined)?.message ?? error.message}`)
  // The usual error body (statusCode, message, …), built by the default handler from a 503.
  const res = await defaultHandler(createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: databaseDownMessage }), event, {
    silent: true,
  })
  setResponseHeaders(event, res.headers)
  setResponseHeader(event, 'retry-after', databaseRetryAfterSeconds)
  setResponseStatus(event, 503, 'Service Unavailable')
  return send(event, JSON.stringify(res.body))
})
