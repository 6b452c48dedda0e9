import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'

// The local mail fake's inbox, for people clicking reset and invitation links in
// development. Exists only while the fake is in use (NUXT_DEV_MAIL=true).
export default defineEventHandler(async () => {
  const { mailCaptureDir, devMail } = useRuntimeConfig()
  if (!devMail || !mailCaptureDir) throw createError({ statusCode: 404, message: 'No such API route' })
  const files = (await readdir(mailCaptureDir).catch(() => [])).filter(f => f.endsWith('.json')).sort().reverse().slice(0, 100)
  const messages = await Promise.all(files.map(async f => JSON.parse(await readFile(join(mailCaptureDir, f), 'utf8'))))
  return { messages }
})
