// A body size limit, and a same-origin rule for requests that change things (a cross-site
// form post carrying our cookie is refused). The Host itself is checked before this, for
// every request (server/plugins/own-host.ts); the headers are route rules (security-headers.ts).
const maxBodyBytes = 1024 * 1024
const uploadBodyBytes = 6 * 1024 * 1024
// Routes that take a picture (at most 5 MB, checked again by the route) in a multipart form.
const uploadPaths = ['/api/motifs/from-picture', '/api/motifs/picture-preview']

function refuseCrossSite(): never {
  throw createError({
    statusCode: 403,
    message: `Cross-site request refused: changes are taken only from this app's own pages (${new URL(useRuntimeConfig().appUrl).origin})`,
  })
}

export default defineEventHandler((event) => {
  if (event.method === 'GET' || event.method === 'HEAD' || event.method === 'OPTIONS') return

  // Browsers send Origin with every write; scheme, host and port must all be ours.
  const origin = getRequestHeader(event, 'origin')
  if (origin !== undefined) {
    if (!isOwnOrigin(event, origin)) refuseCrossSite()
  }
  else {
    // No Origin: a client that is not a browser (no cookie of a victim to ride on), or an old
    // browser that still says where the request came from. A sibling subdomain is not us.
    const site = getRequestHeader(event, 'sec-fetch-site')
    if (site !== undefined && site !== 'same-origin' && site !== 'none') refuseCrossSite()
  }

  const path = event.path.split('?')[0]!
  const limit = uploadPaths.includes(path) ? uploadBodyBytes : maxBodyBytes
  const declared = getRequestHeader(event, 'content-length')
  // A body streamed without a length would be read whole before any limit could apply.
  if (declared === undefined && getRequestHeader(event, 'transfer-encoding')) {
    throw createError({ statusCode: 411, message: 'Send the body with a Content-Length header' })
  }
  const length = Number(declared ?? 0)
  if (length > limit) throw createError({ statusCode: 413, message: `Request body too large (limit ${Math.round(limit / 1024)} KB)` })
})
