// Unknown API paths are a JSON 404, never the app's HTML page. Registered at run time rather
// than as `server/api/[...].ts`: a catch-all route file joins Nitro's typed-route union, and
// with this many routes TypeScript then overflows (TS2321) on every typed `$fetch` call.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.router.use('/api/**', defineEventHandler((event) => {
    throw createError({ statusCode: 404, message: `No such API route: ${event.method} ${event.path.split('?')[0]}` })
  }))
})
