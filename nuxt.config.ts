import { fileURLToPath } from 'node:url'
import { bundlePictureWorker } from './picture-worker.build'
import { pwa } from './pwa.config'
import { apiAnswerHeaders, securityHeaders } from './security-headers'

// srcDir is the project root: pages/, components/ … stand beside server/ and shared/.
export default defineNuxtConfig({
  modules: [
    '@nuxtjs/tailwindcss',
    '@pinia/nuxt',
    '@vueuse/nuxt',
    'nuxt-auth-utils',
    '@vite-pwa/nuxt',
    '@nuxt/eslint',
    '@nuxt/test-utils/module',
  ],
  // The whole app is client-rendered: the tablet must reload any page offline from the
  // service worker's cached shell, and SSR pages cannot be served that way (see DEVELOPERS.md).
  ssr: false,
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en-GB' },
      title: 'Floatwise',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'description', content: 'Floatwise: floats checked, rows planned, and your place kept at the knitting machine.' },
        { name: 'theme-color', content: '#1f4e5f' },
      ],
      link: [
        { rel: 'icon', type: 'image/png', href: '/favicon.png' },
        { rel: 'apple-touch-icon', href: '/icons/apple-touch-icon.png' },
        { rel: 'manifest', href: '/manifest.webmanifest' },
      ],
    },
  },
  css: [
    '@fontsource/nunito/400.css',
    '@fontsource/nunito/600.css',
    '@fontsource/nunito/800.css',
    '~/assets/css/main.css',
  ],
  // Painted from the HTML alone while the app's scripts load, in place of a blank page.
  spaLoadingTemplate: 'spa-loading-template.html',
  runtimeConfig: {
    // Overridden at run time by NUXT_* variables; scripts/start.mjs sets them.
    mailFrom: 'Floatwise <no-reply@floatwise.test>',
    smtpUrl: '',
    // Only the server needs these; the app shell is prerendered, so public values would freeze at build time.
    appUrl: 'http://localhost:3000',
    trustProxy: false,
    // Host names answered besides the app URL's, localhost and IP addresses (NUXT_ALLOWED_HOSTS,
    // comma-separated): every other Host gets 421 (server/utils/ownHosts.ts).
    allowedHosts: '',
    // Where the original motif pictures are kept (NUXT_PICTURES_DIR); empty = the `pictures`
    // storage mount below. Any unstorage driver can replace that mount (see README).
    picturesDir: '',
    // How long one picture may take to read in its worker before it is stopped with a 422
    // (NUXT_PICTURE_DECODE_TIMEOUT_MS); a 4-megapixel picture takes well under a second.
    pictureDecodeTimeoutMs: 10_000,
    // A session cookie is refused 30 days after sign-in (nuxt-auth-utils sets no limit itself).
    session: { maxAge: 30 * 24 * 60 * 60 },
  },
  srcDir: '.',
  routeRules: {
    '/**': { headers: securityHeaders },
    '/api/**': { headers: apiAnswerHeaders },
  },
  compatibilityDate: '2026-11-01',
  nitro: {
    prerender: { routes: ['/'] },
    // Scripts, styles and fonts are kept gzip- and brotli-compressed beside the originals and
    // served compressed to browsers that accept it: a third of the bytes on a slow line.
    compressPublicAssets: true,
    // Original motif pictures, keyed by motif id. The fs base is resolved against the
    // server's working directory at run time; NUXT_PICTURES_DIR overrides it (server/plugins/pictures.ts).
    storage: { pictures: { driver: 'fs', base: '.data/pictures' } },
  },
  typescript: { strict: true },
  hooks: {
    // Errors get their standard status text, and a database that is not answering becomes a
    // 503, before Nuxt's and Nitro's own error handlers see them (Nitro tries the handlers in
    // order until one answers).
    'nitro:config': (config) => {
      const ours = ['statusText', 'databaseDown'].map(name => fileURLToPath(new URL(`./server/error/${name}.ts`, import.meta.url)))
      config.errorHandler = [...ours, ...[config.errorHandler ?? []].flat()]
    },
    'nitro:init': (nitro) => {
      bundlePictureWorker(nitro) // the worker thread that reads pictures
    },
  },
  // The app learns who is signed in from /api/me (stores/account.ts) and never reads the
  // module's client session, so its plugin would only add a request the app waits for at start.
  auth: { loadStrategy: 'none' },
  eslint: { config: { stylistic: { indent: 2, quotes: 'single', semi: false, commaDangle: 'always-multiline', braceStyle: 'stroustrup' } } },
  pwa,
  tailwindcss: {
    cssPath: false,
    configPath: 'tailwind.config.ts',
  },
})
