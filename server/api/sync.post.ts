import { syncBody } from '#shared/validation/sync'

// A device's outbox of row events (or none, to ask where its pieces stand). Events for
// pieces the caller does not knit are listed in `rejected` and stored nowhere.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const body = await readValid(event, syncBody)
  return syncDevice(user.id, body)
})
