// Security headers for every response, pages and static files included (applied as a
// Nitro route rule, which also covers the prerendered app shell).
const contentSecurityPolicy = [
  `default-src 'self'`,
  // Nuxt writes its runtime config as an inline script in the app shell.
  `script-src 'self' 'unsafe-inline'`,
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

export const securityHeaders: Record<string, string> = {
  'Content-Security-Policy': contentSecurityPolicy,
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
