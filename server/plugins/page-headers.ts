import { inlineScriptHashes } from '../../inline-scripts'
import { contentSecurityPolicy } from '../../security-headers'

// Pages rendered at run time (any path that is not a file: /login, /projects/12, Nuxt's
// error page) list the hashes of their own inline scripts, which hold the runtime config
// and so may differ from the prerendered shell's. Nuxt's renderer also says what made it
// (x-powered-by); nobody needs to know.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:response', (response) => {
    if (!response.headers) return
    delete response.headers['x-powered-by']
    if (typeof response.body === 'string' && String(response.headers['content-type']).startsWith('text/html')) {
      response.headers['content-security-policy'] = contentSecurityPolicy(inlineScriptHashes(response.body))
    }
  })
})
