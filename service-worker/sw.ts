/// <reference lib="webworker" />
// Floatwise's service worker: the app shell offline. A piece opened once can be knitted
// with no network at all, after a reload, because every page is the same client-rendered
// shell and the knitter's data is in IndexedDB (offline/db.ts), not in this cache.
import { clientsClaim } from 'workbox-core'
import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from 'workbox-precaching'
import { NavigationRoute, registerRoute } from 'workbox-routing'

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: (string | { url: string; revision: string | null })[] }

precacheAndRoute(self.__WB_MANIFEST)
cleanupOutdatedCaches()
// The first install takes the open tab at once, so a piece opened once works offline
// without a second visit; later versions wait for the knitter's yes (SKIP_WAITING).
clientsClaim()

// Every page navigation gets the prerendered shell ('/'), except the API and the build's own
// files (a missing script must be a 404, not the shell).
registerRoute(new NavigationRoute(createHandlerBoundToURL('/'), {
  denylist: [/^\/api\//, /^\/_nuxt\//],
}))

// The page asks a waiting worker to take over when the knitter accepts the update.
self.addEventListener('message', (event) => {
  if (event.data?.type === 'SKIP_WAITING') void self.skipWaiting()
})
