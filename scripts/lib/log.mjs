// Plain, prefixed progress lines for the set-up scripts.
export const log = (...parts) => console.log('[floatwise]', ...parts)
export const fail = (message) => {
  console.error(`[floatwise] ${message}`)
  process.exit(1)
}
