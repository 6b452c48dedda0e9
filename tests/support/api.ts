import { inject } from 'vitest'

export interface ApiResponse<T = any> { status: number; body: T; headers: Headers }

let addressCounter = 0

/**
 * A small HTTP client for one person: keeps the session cookie like a browser, and
 * signs in from an address of its own so throttling in one test never touches another.
 */
export function apiClient(baseUrl = inject('baseUrl')) {
  let cookie = ''
  const address = `10.${(process.pid >> 8) & 255}.${process.pid & 255}.${(++addressCounter % 250) + 1}`
  async function request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    // A form or raw bytes go as they are (fetch sets the multipart boundary itself).
    const raw = body instanceof FormData || body instanceof Uint8Array
    const res = await fetch(baseUrl + path, {
      method,
      headers: {
        'x-forwarded-for': address,
        ...(cookie ? { cookie } : {}),
        ...(body !== undefined && typeof body !== 'string' && !raw ? { 'content-type': 'application/json' } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : typeof body === 'string' || raw ? body as BodyInit : JSON.stringify(body),
      redirect: 'manual',
    })
    const setCookie = res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))
    if (setCookie) cookie = setCookie.split(';')[0]!
    const text = await res.text()
    let parsed: any = text
    try { parsed = text ? JSON.parse(text) : null }
    catch { /* not JSON */ }
    return { status: res.status, body: parsed, headers: res.headers }
  }
  return {
    address,
    get cookie() { return cookie },
    set cookie(value: string) { cookie = value },
    get: <T = any>(path: string, headers?: Record<string, string>) => request<T>('GET', path, undefined, headers),
    post: <T = any>(path: string, body?: unknown, headers?: Record<string, string>) => request<T>('POST', path, body ?? {}, headers),
    patch: <T = any>(path: string, body?: unknown, headers?: Record<string, string>) => request<T>('PATCH', path, body ?? {}, headers),
    delete: <T = any>(path: string, headers?: Record<string, string>) => request<T>('DELETE', path, undefined, headers),
    request,
  }
}

export type ApiClient = ReturnType<typeof apiClient>

export async function signedIn(email: string, password: string) {
  const client = apiClient()
  const res = await client.post('/api/auth/login', { email, password })
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return client
}

export function uniqueEmail(tag: string) {
  return `${tag}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}@example.test`
}
