import { createHash, randomUUID } from 'node:crypto'
import * as iron from 'iron-webcrypto'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { apiClient, signedIn, uniqueEmail } from '../support/api'
import { startExtraAppServer } from '../support/extraServer'
import { rawRequest } from '../support/rawHttp'
import { closeTestDb, fixturePassword, makeStudio, makeUser } from '../support/db'
import { storedRows } from '../support/storedRows'
import { UserSession } from '../../server/db/models'
import { linkIn, waitForMail } from '../support/mail'

afterAll(closeTestDb)

/**
 * A session cookie sealed the way the server seals them (h3's defaults, our password), for
 * a user, created `ageMs` ago, optionally with a seal that has itself expired.
 */
async function sealedSession(user: { id: number; email: string; name: string }, ageMs: number, sealExpired = false, sid: string | null = randomUUID()) {
  const createdAt = Date.now() - ageMs
  // A live session row for the id, as signing in makes (server/utils/sessions.ts).
  if (sid)
    await UserSession.create({
      userId: user.id,
      sidHash: createHash('sha256').update(sid).digest('hex'),
      device: 'sealed by the test',
      address: '',
      lastSeenAt: new Date(),
    })
  const session = { id: randomUUID(), createdAt, data: { user, loggedInAt: createdAt, ...(sid ? { sid } : {}) } }
  // An expired seal: sealed "two minutes ago" for one second (past the 60 s clock skew allowed).
  const expiry = sealExpired ? { ttl: 1000, localtimeOffsetMsec: -120_000 } : { ttl: 0 }
  // Node's WebCrypto types and iron's disagree on buffer types only; the object is the one h3 uses.
  const sealed = await iron.seal(globalThis.crypto as unknown as Parameters<typeof iron.seal>[0], session, process.env.NUXT_SESSION_PASSWORD!, {
    ...iron.defaults,
    ...expiry,
  })
  return `nuxt-session=${sealed}`
}

describe('security at the edge', () => {
  it('sends the security headers on pages and API answers', async () => {
    for (const path of ['/', '/login', '/api/health']) {
      const res = await apiClient().get(path)
      const csp = res.headers.get('content-security-policy') ?? ''
      expect(csp).toContain(`frame-ancestors 'none'`)
      expect(csp).toContain(`worker-src 'self'`)
      expect(res.headers.get('x-content-type-options')).toBe('nosniff')
      expect(res.headers.get('referrer-policy')).toBeTruthy()
    }
  })

  it('refuses a cross-site POST that carries the session cookie', async () => {
    const knitter = await signedIn('knitter@floatwise.test', 'floatwise-demo')
    const res = await knitter.post('/api/auth/logout', {}, { origin: 'https://elsewhere.example' })
    expect(res.status).toBe(403)
    expect(res.body.message).toMatch(/Cross-site/)
    expect((await knitter.get('/api/me')).status).toBe(200) // still signed in
  })

  it('treats a tampered session cookie as no session', async () => {
    const knitter = await signedIn('knitter@floatwise.test', 'floatwise-demo')
    const tampered = apiClient()
    tampered.cookie = knitter.cookie.slice(0, -4) + 'AAAA'
    expect((await tampered.get('/api/me')).status).toBe(401)
  })

  it('refuses a cross-site write with the cookie before anything is stored, with or without an Origin', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const before = await storedRows([f.studio.id])
    const yarn = { studioId: f.studio.id, name: 'Cross-site yarn', hex: '#112233', weightCategory: 1, metresPer100g: 400 }
    for (const headers of [{ origin: 'https://elsewhere.example' }, { 'sec-fetch-site': 'cross-site' }, { origin: 'not a url' }] as Record<string, string>[]) {
      const res = await owner.post('/api/yarns', yarn, headers)
      expect(res.status, JSON.stringify(headers)).toBe(403)
    }
    expect(await storedRows([f.studio.id])).toEqual(before)
    expect((await owner.post('/api/yarns', yarn)).status).toBe(201) // the same request from our own page works
  })

  it('treats an expired session cookie as no session (sealed like the server\'s, only older)', async () => {
    const user = await makeUser('expiry')
    const session = { id: user.id, email: user.email, name: user.name }
    const day = 24 * 60 * 60_000
    const fresh = apiClient()
    fresh.cookie = await sealedSession(session, 0)
    expect((await fresh.get('/api/me')).status).toBe(200) // the sealing is right: a new one is accepted
    const old = apiClient()
    old.cookie = await sealedSession(session, 31 * day)
    expect((await old.get('/api/me')).status).toBe(401)
    const lapsed = apiClient()
    lapsed.cookie = await sealedSession(session, 0, true)
    expect((await lapsed.get('/api/me')).status).toBe(401)
    // Sealed right, but naming no session (a cookie from before sessions were kept): no session.
    const nameless = apiClient()
    nameless.cookie = await sealedSession(session, 0, false, null)
    expect((await nameless.get('/api/me')).status).toBe(401)
  })

  it('tells nobody whether an address is registered: sign-up, sign-in, reset, invitation and sharing answer alike', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const registered = (await makeUser('known')).email
    const plan = await owner.post('/api/plans', {
      studioId: f.studio.id,
      name: 'Shared',
      published: true,
      pieces: [{ name: 'Back', targetWidth: 20, targetLength: 10, sections: [{ kind: 'plain', rows: 4, yarn: 'A' }] }],
    })
    expect(plan.status).toBe(201)
    const answers = async (email: string) => {
      const calls = [
        apiClient().post('/api/auth/register', { email, password: 'probe-password-1', name: 'Probe' }),
        apiClient().post('/api/auth/login', { email, password: 'probe-wrong-password' }),
        apiClient().post('/api/auth/password-reset', { email }),
        owner.post(`/api/studios/${f.studio.id}/invitations`, { email, role: 'knitter' }),
        owner.post(`/api/plans/${plan.body.id}/share`, { email }),
      ]
      // Ids, times and the address itself differ by nature; the shape and the words must not.
      return (await Promise.all(calls)).map(r => ({ status: r.status, body: JSON.stringify(r.body).replace(email, 'EMAIL').replace(/\d+/g, 'N') }))
    }
    expect(await answers(registered)).toEqual(await answers(uniqueEmail('unknown')))
  })

  it('an invitation link works once and not after it expires', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const email = uniqueEmail('once')
    await owner.post(`/api/studios/${f.studio.id}/invitations`, { email, role: 'knitter' })
    const token = linkIn(await waitForMail(email), '/invitations/').pathname.split('/').pop()!
    const accept = () => apiClient().post(`/api/invitations/${token}/accept`, { name: 'Once', password: 'once-password-1' })
    expect((await accept()).status).toBe(200)
    const again = await accept()
    expect(again.status).toBe(404)
    expect(again.body.message).toMatch(/expired or was already used/)
    expect((await apiClient().get(`/api/invitations/${token}`)).status).toBe(404)
  })

  it('answers an oversized body with 413', async () => {
    const res = await apiClient().post('/api/auth/login', JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(2 * 1024 * 1024) }), {
      'content-type': 'application/json',
    })
    expect(res.status).toBe(413)
  })

  it('answers broken JSON with a 400 and unknown API paths with a JSON 404, never a stack', async () => {
    const broken = await apiClient().post('/api/auth/login', '{"email":', { 'content-type': 'application/json' })
    expect(broken.status).toBe(400)
    const unknown = await apiClient().get('/api/no/such/thing')
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toContain('/api/no/such/thing')
    for (const body of [broken.body, unknown.body]) expect(JSON.stringify(body)).not.toMatch(/stack|\.mjs:\d+/)
  })
})

// The test server listens on 127.0.0.1 with NUXT_APP_URL http://127.0.0.1:<port> and
// NUXT_TRUST_PROXY=true (tests/support/appServer.ts).
describe('the same-origin rule for writes', () => {
  const yarnFor = (studioId: number) => ({ studioId, name: 'Cross-origin yarn', hex: '#445566', weightCategory: 1, metresPer100g: 400 })

  it('refuses a write whose Origin is null (a sandboxed page, a plain form) or a sibling site, with no Sec-Fetch-Site to rely on', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const before = await storedRows([f.studio.id])
    for (const headers of [{ origin: 'null' }, { 'sec-fetch-site': 'same-site' }] as Record<string, string>[]) {
      const res = await owner.post('/api/yarns', yarnFor(f.studio.id), headers)
      expect(res.status, JSON.stringify(headers)).toBe(403)
      expect(res.body.message).toMatch(/Cross-site request refused/)
    }
    expect(await storedRows([f.studio.id])).toEqual(before)
  })

  it('compares the scheme and the port with ours, not only the host name', async () => {
    const f = await makeStudio()
    const owner = await signedIn(f.owner.email, fixturePassword)
    const { port } = new URL(inject('baseUrl'))
    const before = await storedRows([f.studio.id])
    for (const origin of [`https://127.0.0.1:${port}`, `http://127.0.0.1:${Number(port) + 1}`, 'http://127.0.0.1']) {
      const res = await owner.post('/api/yarns', yarnFor(f.studio.id), { origin })
      expect(res.status, origin).toBe(403)
    }
    expect(await storedRows([f.studio.id])).toEqual(before)
    expect((await owner.post('/api/yarns', yarnFor(f.studio.id), { origin: `http://127.0.0.1:${port}` })).status).toBe(201)
  })
})

describe('the Host a request names (DNS rebinding)', () => {
  it('answers 421 to a Host that is not ours on every route: the shell, pages, scripts, the API, reads and writes', async () => {
    const baseUrl = inject('baseUrl')
    const script = (await rawRequest(baseUrl, '/')).body.match(/src="(\/_nuxt\/[^"]+\.js)"/)![1]!
    const calls = [
      ['GET', '/'],
      ['GET', '/index.html'],
      ['GET', '/login'],
      ['GET', script],
      ['GET', '/api/health'],
      ['GET', '/api/me'],
      ['GET', '/api/no/such'],
      ['POST', '/api/auth/login'],
    ]
    for (const [method, path] of calls) {
      const res = await rawRequest(baseUrl, path!, {
        method,
        headers: { 'host': 'rebound.example', 'content-type': 'application/json' },
        body: method === 'POST' ? '{}' : undefined,
      })
      expect(res.status, `${method} ${path}`).toBe(421)
      expect(res.body, `${method} ${path}`).toContain('rebound.example')
    }
    // Behind the proxy the tests play, the forwarded name is the one the browser used.
    const forwarded = await rawRequest(baseUrl, '/api/health', { headers: { 'x-forwarded-host': 'rebound.example' } })
    expect(forwarded.status).toBe(421)
    const garbled = await rawRequest(baseUrl, '/api/health', { headers: { host: 'bad host name' } })
    expect(garbled.status).toBe(400)
  })

  it('answers our app URL\'s host, the loopback names and any address typed as an IP (a tablet on the LAN)', async () => {
    const baseUrl = inject('baseUrl')
    const { port } = new URL(baseUrl)
    for (const host of [`127.0.0.1:${port}`, `localhost:${port}`, `[::1]:${port}`, '192.168.1.20:3000', '10.0.0.7', `[fd00::20]:${port}`]) {
      const res = await rawRequest(baseUrl, '/api/health', { headers: { host } })
      expect(res.status, host).toBe(200)
    }
  })
})

describe('a server without a proxy (NUXT_TRUST_PROXY=false), with NUXT_ALLOWED_HOSTS', () => {
  let server: Awaited<ReturnType<typeof startExtraAppServer>>
  beforeAll(async () => {
    server = await startExtraAppServer({ NUXT_TRUST_PROXY: 'false', NUXT_ALLOWED_HOSTS: 'knitroom.local, Studio.Example' })
  })
  afterAll(() => server?.close())

  it('ignores X-Forwarded-Host and X-Forwarded-Proto: anyone can send them', async () => {
    const client = apiClient(server.baseUrl)
    const reset = { email: uniqueEmail('forwarded') }
    const forged = await client.post('/api/auth/password-reset', reset, { 'origin': 'http://forged.example', 'x-forwarded-host': 'forged.example' })
    expect(forged.status).toBe(403)
    const proto = await client.post('/api/auth/password-reset', reset, { 'origin': server.baseUrl.replace('http:', 'https:'), 'x-forwarded-proto': 'https' })
    expect(proto.status).toBe(403)
    // A forwarded name that is not ours changes nothing either: the Host is ours.
    expect((await client.get('/api/health', { 'x-forwarded-host': 'forged.example' })).status).toBe(200)
    expect((await client.post('/api/auth/password-reset', reset, { origin: server.baseUrl })).status).toBe(202)
  })

  it('answers the names listed in NUXT_ALLOWED_HOSTS, and takes writes from their own origin', async () => {
    for (const host of [`knitroom.local:${server.port}`, 'studio.example']) {
      expect((await rawRequest(server.baseUrl, '/api/health', { headers: { host } })).status, host).toBe(200)
    }
    const body = JSON.stringify({ email: uniqueEmail('allowed') })
    const write = (origin: string) =>
      rawRequest(server.baseUrl, '/api/auth/password-reset', {
        method: 'POST',
        headers: { 'host': `knitroom.local:${server.port}`, origin, 'content-type': 'application/json' },
        body,
      })
    expect((await write(`http://knitroom.local:${server.port}`)).status).toBe(202)
    expect((await write(`http://studio.example:${server.port}`)).status).toBe(403)
    expect((await rawRequest(server.baseUrl, '/api/health', { headers: { host: 'knitroom.local.rebound.example' } })).status).toBe(421)
  })
})

/** The executable inline scripts of a page (not `src=` ones, not JSON data blocks). */
function inlineScripts(html: string) {
  return [...html.matchAll(/<script([^>]*)>([\s\S]*?)<\/script>/gi)]
    .filter(([, attributes]) => !/(?:^|\s)src\s*=/i.test(attributes!) && !/\btype\s*=\s*"?application\/(ld\+)?json/i.test(attributes!))
    .map(([, , text]) => text!)
}

describe('response headers', () => {
  it('allows inline scripts by their hash only: no \'unsafe-inline\' for scripts, each inline script of the shell and of a page listed', async () => {
    for (const path of ['/', '/index.html', '/login', '/projects/12']) {
      const res = await rawRequest(inject('baseUrl'), path)
      const scriptSrc = (res.headers['content-security-policy'] as string).split(';').map(d => d.trim()).find(d => d.startsWith('script-src '))!
      expect(scriptSrc, path).not.toContain('unsafe-inline')
      const scripts = inlineScripts(res.body)
      expect(scripts.length, path).toBeGreaterThanOrEqual(2) // the theme before first paint, Nuxt's config
      for (const text of scripts) expect(scriptSrc, `${path}: ${text.slice(0, 60)}`).toContain(`'sha256-${createHash('sha256').update(text).digest('base64')}'`)
    }
  })

  it('marks every API answer as not to be stored, signed in or not, while scripts keep their long cache', async () => {
    const knitter = await signedIn('knitter@floatwise.test', 'floatwise-demo')
    for (const [client, path] of [
      [knitter, '/api/me'],
      [knitter, '/api/projects'],
      [knitter, '/api/yarns'],
      [apiClient(), '/api/me'],
      [apiClient(), '/api/health'],
    ] as const) {
      const res = await client.get(path)
      expect(res.headers.get('cache-control'), `${path} (${res.status})`).toBe('no-store')
    }
    const script = (await apiClient().get('/')).body.match(/src="(\/_nuxt\/[^"]+\.js)"/)[1]
    expect((await apiClient().get(script)).headers.get('cache-control')).toBe('public, max-age=31536000, immutable')
  })

  it('does not say what the server is made of (no x-powered-by)', async () => {
    for (const path of ['/', '/login', '/projects', '/api/health', '/api/me', '/api/no/such']) {
      expect((await apiClient().get(path)).headers.get('x-powered-by'), path).toBeNull()
    }
  })

  it('sends the standard status text with an error: 404 Not Found, 401 Unauthorized, not "Server Error"', async () => {
    const baseUrl = inject('baseUrl')
    for (const [path, status, text] of [
      ['/api/no/such', 404, 'Not Found'],
      ['/_nuxt/no-such-chunk.js', 404, 'Not Found'],
      ['/api/me', 401, 'Unauthorized'],
    ] as const) {
      const res = await rawRequest(baseUrl, path)
      expect([res.status, res.statusText], path).toEqual([status, text])
    }
  })
})
