import { isUtf8 } from 'node:buffer'
import type { H3Event } from 'h3'

// Deeper than any body of ours (a plan is 5 levels); the limit keeps a hostile body from
// costing recursion in the parser and the schema.
const maxDepth = 32

/** How deeply arrays and objects nest in JSON text (brackets inside strings do not count). */
function nestingDepth(text: string) {
  let depth = 0, deepest = 0, inString = false
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i)
    if (inString) {
      if (c === 0x5C) i++ // a backslash escapes the next character
      else if (c === 0x22) inString = false
    }
    else if (c === 0x22) inString = true
    else if (c === 0x5B || c === 0x7B) deepest = Math.max(deepest, ++depth)
    else if (c === 0x5D || c === 0x7D) depth--
  }
  return deepest
}

/**
 * The request body as JSON, or undefined when there is none. h3's readBody would take any
 * content type (a form becomes an object of strings), replace bytes that are not UTF-8 and
 * turn broken JSON into a plain string; each of those is a 4xx here that says what is wrong.
 */
export async function readJsonBody(event: H3Event): Promise<unknown> {
  const raw = await readRawBody(event, false)
  if (!raw || raw.length === 0) return undefined
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  if (type !== 'application/json') {
    throw createError({ statusCode: 415, message: `Send the body as JSON with Content-Type: application/json (this one is ${type || 'without a type'})` })
  }
  if (!isUtf8(raw)) throw createError({ statusCode: 400, message: 'The body is not valid UTF-8 text' })
  const text = raw.toString('utf8')
  const depth = nestingDepth(text)
  if (depth > maxDepth) throw createError({ statusCode: 400, message: `The body nests ${depth} levels deep; at most ${maxDepth} are accepted` })
  try { return JSON.parse(text) }
  catch (e) {
    throw createError({ statusCode: 400, message: `The body is not valid JSON: ${(e as Error).message}` })
  }
}
