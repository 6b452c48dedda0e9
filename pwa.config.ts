import type { ModuleOptions } from '@vite-pwa/nuxt'

// Installable app and offline shell. The service worker is our own (service-worker/sw.ts, built
// with injectManifest): it precaches the app shell, fonts, icons and sounds, answers every
// page navigation with the prerendered shell, and never touches /api/ (the knitter's place
// lives in IndexedDB; the server is reached only through the sync outbox).
export const pwa: Partial<ModuleOptions> = {
  strategies: 'injectManifest',
  srcDir: 'service-worker',
  filename: 'sw.ts',
  registerType: 'prompt',
  manifest: {
    name: 'Floatwise',
    short_name: 'Floatwise',
    description: 'Float check, row plans and your place at the knitting machine.',
    lang: 'en-GB',
    theme_color: '#1f4e5f',
    background_color: '#f7f4ee',
    display: 'standalone',
    start_url: '/',
    scope: '/',
    icons: [
      { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
      { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
      { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
    ],
  },
  injectManifest: {
    globPatterns: ['**/*.{js,css,html,woff,woff2,png,svg,wav}'],
    globIgnores: ['_payload.json', '**/_payload.json'],
    maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
  },
  client: { installPrompt: false, periodicSyncForUpdates: 3600 },
  devOptions: { enabled: false },
}
