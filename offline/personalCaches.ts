// Cache Storage is shared by everyone who uses this browser profile. Our service worker keeps
// only the app shell there (service-worker/sw.ts), but any answer of /api/ in any cache — a runtime
// cache added later, a library's own cache — is one person's data and must not outlive their
// sign-out. The shell stays, so the next person can still open the app offline.

function isPersonal(request: Request): boolean {
  return new URL(request.url).pathname.startsWith('/api/')
}

/** Deletes every cached /api/ answer; returns how many went. */
export async function clearPersonalCaches(storage: CacheStorage | undefined = globalThis.caches): Promise<number> {
  if (!storage) return 0
  let deleted = 0
  for (const name of await storage.keys()) {
    const cache = await storage.open(name)
    for (const request of await cache.keys()) {
      if (isPersonal(request) && await cache.delete(request)) deleted += 1
    }
  }
  return deleted
}
