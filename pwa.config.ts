import type { ModuleOptions } from '@vite-pwa/nuxt'

// The service worker and offline shell (issue: knit view) build on this; for now the
// manifest makes the app installable and the shell is precached.
export const pwa: Partial<ModuleOptions> = {
  registerType: 'prompt',
  manifest: {
    name: 'Floatwise',
    short_name: 'Floatwise',
    description: 'Float check, row plans and your place at the knitting machine.',
    theme_color: '#1f4e5f',
    background_color: '#f7f4ee',
    display: 'standalone',
    icons: [],
  },
  workbox: {
    navigateFallback: '/',
    navigateFallbackDenylist: [/^\/api\//, /^\/auth\//],
    globPatterns: ['**/*.{js,css,html,woff2,png,svg,ico,mp3}'],
  },
  client: { installPrompt: false },
  devOptions: { enabled: false },
}
