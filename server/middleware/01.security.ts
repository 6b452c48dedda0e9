// A body size limit, and a same-origin rule for requests that change things (a cross-site
// form post carrying our cookie is refused). The headers are route rules (security-headers.ts).
const maxBodyBytes = 1024 * 1024
const uploadBodyBytes = 6 * 1024 * 1024
// Routes that take a picture (at most 5 MB, checked again by the route) in a multipart form.
const uploadPaths = ['/api/motifs/from-picture', '/api/motifs/picture-preview']

export default defineEventHandler((event) => {
  if (event.method === 'GET' || event.method === 'HEAD' || event.method === 'OPTIONS') return

  const origin = getRequestHeader(event, 'origin')
  if (origin && origin !== 'null') {
    const host = getRequestHeader(event, 'x-forwarded-host') ?? getRequestHeader(event, 'host')
    let originHost = ''
    try { originHost = new URL(origin).host }
    catch { /* malformed Origin: refused below */ }
    if (originHost !== host) throw createError({ statusCode: 403, message: 'Cross-site request refused' })
  }
  else if (getRequestHeader(event, 'sec-fetch-site') === 'cross-site') {
    throw createError({ statusCode: 403, message: 'Cross-site request refused' })
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
