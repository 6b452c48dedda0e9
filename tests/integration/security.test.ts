import { describe, expect, it } from 'vitest'
import { apiClient, signedIn } from '../support/api'

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

  it('answers an oversized body with 413', async () => {
    const res = await apiClient().post('/api/auth/login', JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(2 * 1024 * 1024) }), { 'content-type': 'application/json' })
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
