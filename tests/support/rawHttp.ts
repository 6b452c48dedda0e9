import { request, type IncomingHttpHeaders } from 'node:http'

export interface RawResponse { status: number; statusText: string; headers: IncomingHttpHeaders; body: string }

/**
 * One request through node:http, for what fetch will not send as asked: fetch (undici)
 * replaces a `host` header with the URL's own, and a DNS-rebinding page is exactly a
 * request whose Host is someone else's name.
 */
export function rawRequest(
  baseUrl: string,
  path: string,
  options: { method?: string; headers?: Record<string, string>; body?: string } = {},
): Promise<RawResponse> {
  const url = new URL(path, baseUrl)
  return new Promise((resolve, reject) => {
    const req = request(
      { host: url.hostname, port: url.port, path: url.pathname + url.search, method: options.method ?? 'GET', headers: options.headers },
      (res) => {
        let body = ''
        res.setEncoding('utf8')
        res.on('data', (chunk) => {
          body += chunk
        })
        res.on('end', () => resolve({ status: res.statusCode!, statusText: res.statusMessage ?? '', headers: res.headers, body }))
      },
    )
    req.on('error', reject)
    req.end(options.body)
  })
}
