import { mkdtempSync, writeFileSync } from 'node:fs'
import { connect } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { startMailViewer } from '../../../scripts/lib/mail-fake.mjs'

const dir = mkdtempSync(join(tmpdir(), 'floatwise-viewer-'))
writeFileSync(join(dir, '1-a.json'), JSON.stringify({
  to: 'someone@floatwise.test', from: 'no-reply@floatwise.test', at: '2026-12-02T10:00:00.000Z',
  subject: '<script>alert(1)</script>', text: 'Set a password: http://localhost:3000/reset-password?token=abc <img src=x onerror=alert(2)>',
}))
const viewer = await startMailViewer(dir)
afterAll(() => viewer.close())

/** Whether a TCP connection to host:port is accepted. */
function accepts(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect({ host, port, timeout: 2000 })
    socket.once('connect', () => { socket.destroy(); resolve(true) })
    socket.once('error', () => resolve(false))
    socket.once('timeout', () => { socket.destroy(); resolve(false) })
  })
}

describe('the mail fake\'s inbox viewer', () => {
  // The listening socket's own address: bound to 0.0.0.0 or :: it would take connections
  // from the workroom's network. (Test traffic stays on loopback, so the other interfaces
  // are not dialled.)
  it('listens on 127.0.0.1 only', async () => {
    expect(viewer.address).toBe('127.0.0.1')
    expect(await accepts('127.0.0.1', viewer.port)).toBe(true)
  })

  it('shows every field as text, never as markup', async () => {
    const page = await (await fetch(viewer.url)).text()
    expect(page).toContain('&lt;script&gt;alert(1)&lt;/script&gt;')
    expect(page).not.toContain('<script>')
    expect(page).not.toContain('<img')
    expect(page).toContain('<a href="http://localhost:3000/reset-password?token=abc">')
    const json = await (await fetch(`${viewer.url}messages.json`)).json() as { messages: { subject: string }[] }
    expect(json.messages[0]!.subject).toBe('<script>alert(1)</script>')
  })

  it('answers only GET and only its two paths', async () => {
    expect((await fetch(viewer.url, { method: 'POST' })).status).toBe(405)
    expect((await fetch(`${viewer.url}../../etc/passwd`)).status).toBe(404)
  })
})
