/** MariaDB keeps JSON as LONGTEXT and may hand it back as a string: always give the object. */
export function parsedJson<T>(value: unknown): T {
  return (typeof value === 'string' ? JSON.parse(value) : value) as T
}
