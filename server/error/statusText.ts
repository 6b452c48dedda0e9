import { STATUS_CODES } from 'node:http'
import { defineNitroErrorHandler } from 'nitropack/runtime'

// Errors made with only a status code and a message (`createError({ statusCode, message })`)
// would go out as "404 Server Error", Nitro's fallback text. Each gets its standard text
// ("Not Found", "Unauthorized") here, first in the chain (nuxt.config.ts), and is passed on.
export default defineNitroErrorHandler((error) => {
  error.statusMessage ||= STATUS_CODES[error.statusCode]
})
