import fsDriver from 'unstorage/drivers/fs'

// NUXT_PICTURES_DIR moves the kept motif pictures to another folder at run time (the
// default mount in nuxt.config.ts is fixed at build time).
export default defineNitroPlugin(async () => {
  const dir = useRuntimeConfig().picturesDir
  if (!dir || import.meta.prerender) return
  await useStorage().unmount('pictures')
  useStorage().mount('pictures', fsDriver({ base: dir }))
})
