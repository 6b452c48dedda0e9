// Models are bound on start so a bad DATABASE_URL shows at once, and the pool closes with
// Nitro. The prerenderer (which only renders the app shell) has no database.
export default defineNitroPlugin((nitro) => {
  if (import.meta.prerender) return
  useDb()
  nitro.hooks.hook('close', closeDb)
})
