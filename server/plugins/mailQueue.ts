// Sends queued mail (server/utils/mailQueue.ts): at once after a route queues one, and every
// few seconds for retries and for what another server or an earlier run left behind.
export default defineNitroPlugin((nitro) => {
  if (import.meta.prerender) return
  const timer = setInterval(() => { void kickMailQueue() }, 2_000)
  timer.unref()
  void kickMailQueue()
  // What is not sent by the time the server stops stays queued for its next start.
  nitro.hooks.hook('close', () => clearInterval(timer))
})
