import { defineNuxtModule } from '@nuxt/kit'
import type { Nitro } from 'nitropack'
import { inlineScriptHashes } from '../inline-scripts'
import { contentSecurityPolicy } from '../security-headers'

// The prerendered shell (.output/public/index.html) is a static file: Nitro serves it, and
// the service worker its cached copy, with the route rule's headers, so its script hashes
// must be in that rule. Nuxt prerenders before it bundles the server, so the hashes of
// what was just written are put into the rules that bundle carries. Pages the server renders
// at run time get the hashes of their own HTML (server/plugins/page-headers.ts).
export default defineNuxtModule({
  meta: { name: 'shell-script-hashes' },
  setup(_options, nuxt) {
    nuxt.hook('nitro:init', (nitro: Nitro) => {
      const hashes = new Set<string>()
      nitro.hooks.hook('prerender:generate', (route) => {
        if (route.fileName?.endsWith('.html') && route.contents) for (const hash of inlineScriptHashes(route.contents)) hashes.add(hash)
      })
      nitro.hooks.hook('prerender:done', () => {
        const policy = contentSecurityPolicy([...hashes])
        // The same rules live in two places: the options, and the runtime config that is bundled.
        for (const rules of new Set([nitro.options.routeRules, nitro.options.runtimeConfig.nitro?.routeRules])) {
          const headers = rules?.['/**']?.headers
          if (!headers?.['Content-Security-Policy'])
            throw new Error('shell-script-hashes: the /** route rule has no Content-Security-Policy to extend (nuxt.config.ts)')
          headers['Content-Security-Policy'] = policy
        }
      })
    })
  },
})
