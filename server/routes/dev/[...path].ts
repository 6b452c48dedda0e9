// The app server never serves the local mail fake's inbox (reset and invitation links are in
// it). Development pages live on the fake's own viewer, bound to 127.0.0.1 (scripts/lib/mail-fake.mjs).
// Without this route the client-rendered shell would answer 200 for any /dev/ path.
export default defineEventHandler(() => {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'No such page' })
})
