import { mkdirSync, readdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import { createServer as createHttpServer } from 'node:http'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

/**
 * The local stand-in for a mail provider: an SMTP server on loopback that keeps each
 * message as JSON in `dir` (read by the viewer below and by the tests). Port 0 picks a free one.
 */
export async function startMailFake(dir, port = 0) {
  mkdirSync(dir, { recursive: true })
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream).then((mail) => {
        const record = {
          to: session.envelope.rcptTo.map(r => r.address).join(', '),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          at: new Date().toISOString(),
        }
        // Written aside and renamed: a reader of *.json (tests/support/mail.ts) never sees half a file.
        const name = `${dir}/${Date.now()}-${randomUUID()}`
        writeFileSync(`${name}.part`, JSON.stringify(record, null, 2))
        renameSync(`${name}.part`, `${name}.json`)
        callback()
      }, callback)
    },
  })
  await new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', resolve)
  })
  const address = server.server.address()
  return {
    url: `smtp://127.0.0.1:${address.port}`,
    port: address.port,
    close: () => new Promise(resolve => server.close(resolve)),
  }
}

const escapeHtml = s => String(s).replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c])

/** The newest captured messages (at most 100), newest first. */
export function readCapturedMail(dir) {
  return readdirSync(dir).filter(f => f.endsWith('.json')).sort().reverse().slice(0, 100)
    .map(f => JSON.parse(readFileSync(join(dir, f), 'utf8')))
}

/**
 * A read-only inbox for the mail fake, for people clicking reset and invitation links while
 * developing. It holds live tokens, so it is never part of the app server: it listens on
 * 127.0.0.1 only (not reachable from the workroom's network) and on a port of its own.
 * `/` is a page, `/messages.json` the same as JSON. Every field is escaped (mail text is
 * whatever someone typed into a form).
 */
export async function startMailViewer(dir, port = 0) {
  mkdirSync(dir, { recursive: true })
  const server = createHttpServer((req, res) => {
    const headers = {
      'cache-control': 'no-store',
      'x-content-type-options': 'nosniff',
      'content-security-policy': 'default-src \'none\'; style-src \'unsafe-inline\'',
    }
    if (req.method !== 'GET') {
      res.writeHead(405, headers).end('Only GET')
      return
    }
    const messages = readCapturedMail(dir)
    if (req.url === '/messages.json') {
      res.writeHead(200, { ...headers, 'content-type': 'application/json' }).end(JSON.stringify({ messages }))
      return
    }
    if (req.url !== '/') {
      res.writeHead(404, headers).end('Not found')
      return
    }
    const linkify = text => escapeHtml(text).replace(/https?:\/\/[^\s<]+/g, url => `<a href="${url}">${url}</a>`)
    const items = messages
      .map(
        m =>
          `<article><h2>${escapeHtml(m.subject)}</h2><p class="meta">To ${escapeHtml(m.to)} · ${escapeHtml(m.at)}</p><pre>${linkify(m.text)}</pre></article>`,
      )
      .join('')
    res.writeHead(200, { ...headers, 'content-type': 'text/html; charset=utf-8' })
      .end(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Floatwise mail fake</title>
<style>body{font-family:sans-serif;max-width:50rem;margin:2rem auto;padding:0 1rem}article{border-top:1px solid #ccc;padding:.5rem 0}pre{white-space:pre-wrap;word-break:break-word}.meta{color:#555}</style></head>
<body><h1>Mail sent by the local Floatwise server</h1><p class="meta">Only on this computer (127.0.0.1). Reload for new mail.</p>${items || '<p>No mail yet.</p>'}</body></html>`)
  })
  await new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', resolve)
  })
  const address = server.address()
  return {
    url: `http://127.0.0.1:${address.port}/`,
    port: address.port,
    address: address.address,
    close: () => new Promise(resolve => server.close(resolve)),
  }
}
