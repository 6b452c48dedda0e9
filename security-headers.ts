// Security headers for every response, pages and static files included (applied as a
// Nitro route rule, which also covers the prerendered app shell).

/**
 * The Content-Security-Policy. Scripts run from our own files, and the inline scripts of the
 * app shell (the theme before first paint, Nuxt's runtime config) only by their SHA-256
 * (`'sha256-…'`, see inline-scripts.ts): the shell is the same prerendered file for every
 * request and is served from the service worker's cache offline, so there is no per-request
 * HTML to carry a nonce. Styles keep 'unsafe-inline' (Vue's style bindings).
 */
export function contentSecurityPolicy(scriptHashes: string[] = []) {
  return [
    `default-src 'self'`,
    ['script-src', `'self'`, ...scriptHashes].join(' '),
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data: blob:`,
    `font-src 'self' data:`,
    `media-src 'self' data: blob:`,
    `connect-src 'self'`,
    `worker-src 'self'`,
    `manifest-src 'self'`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `form-action 'self'`,
    `frame-ancestors 'none'`,
  ].join('; ')
}

/** The hashes of the prerendered shell are added at build time (modules/shell-script-hashes.ts). */
export const securityHeaders: Record<string, string> = {
  'Content-Security-Policy': contentSecurityPolicy(),
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'same-origin',
  'X-Frame-Options': 'DENY',
  'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), screen-wake-lock=(self)',
  'Cross-Origin-Opener-Policy': 'same-origin',
}

// API answers are the signed-in person's own (their studio, their rows): no cache between
// them and the tablet may keep one, nor the browser's. The app never relies on the HTTP
// cache for them (the service worker leaves /api/ alone; the offline copy is IndexedDB).
// /api/health is no exception: a stored health answer would hide an outage.
export const apiAnswerHeaders: Record<string, string> = {
  'Cache-Control': 'no-store',
}
