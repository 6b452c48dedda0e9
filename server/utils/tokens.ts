import { createHash, randomBytes } from 'node:crypto'

/** A fresh single-use token for a link, and the hash we store (never the token itself). */
export function newLinkToken() {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashLinkToken(token) }
}

export function hashLinkToken(token: string) {
  return createHash('sha256').update(token).digest('hex')
}
