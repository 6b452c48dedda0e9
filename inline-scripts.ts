import { createHash } from 'node:crypto'

const scriptElement = /<script\b([^>]*)>([\s\S]*?)<\/script\s*>/gi
const javascriptType = /^(?:module|(?:text|application)\/(?:x-)?(?:javascript|ecmascript))$/

/** Whether a <script>'s attributes make it an inline script the browser runs (no src, a JavaScript type). */
function runsInline(attributes: string) {
  if (/(?:^|\s)src\s*=/i.test(attributes)) return false
  const type = /(?:^|\s)type\s*=\s*["']?([^"'\s>]*)/i.exec(attributes)?.[1]?.trim().toLowerCase()
  return !type || javascriptType.test(type) // JSON data blocks are never run
}

/**
 * The CSP hash sources (`'sha256-…'`) of the inline scripts an HTML page runs, in order,
 * without repeats. Browsers hash the script's text after the HTML parser turned CR LF and CR
 * into LF, so the same is done here.
 */
export function inlineScriptHashes(html: string) {
  const hashes = new Set<string>()
  for (const [, attributes, text] of html.matchAll(scriptElement)) {
    if (!runsInline(attributes!)) continue
    hashes.add(`'sha256-${createHash('sha256').update(text!.replace(/\r\n?/g, '\n'), 'utf8').digest('base64')}'`)
  }
  return [...hashes]
}
