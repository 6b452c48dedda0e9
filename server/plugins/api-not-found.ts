// Unknown API paths are a JSON 404, never the app's HTML page.
export default defineEventHandler((event) => {
  throw createError({ statusCode: 404, message: `No such API route: ${event.method} ${event.path.split('?')[0]}` })
})
