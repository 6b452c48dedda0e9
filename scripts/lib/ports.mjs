import { createServer } from 'node:net'

/** Fails early with a way out when a port we are about to use is taken by something else. */
export async function assertPortFree(port, what, variable) {
  const free = await new Promise((resolve) => {
    const probe = createServer()
    probe.once('error', () => resolve(false))
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)))
  })
  if (!free)
    throw new Error(
      `Port ${port} for ${what} is already in use (another Floatwise checkout, or another program). Stop it, or choose another port with ${variable}=<port>.`,
    )
}
