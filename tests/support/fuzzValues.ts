import fc from 'fast-check'

// What a careless or hostile client sends where a field, a path segment or a query value is
// expected. The fixed values are the classic troublemakers; the generated ones find the rest.

const troublemakers: unknown[] = [
  null, true, false, '', ' ', 0, -1, -0.5, 0.5, 1e-9, 1e308, -1e308, 2 ** 53 + 1, 2 ** 31, 2 ** 32,
  '9'.repeat(400), '1', '1e308', '-1', [], {}, [[[]]], { toString: 'x' }, ['x'],
  '<script>window.__xss=1</script>', '\' OR 1=1; --', '\u0000', '\uD800', '😀'.repeat(50), 'x'.repeat(6000),
]

export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(...troublemakers),
  fc.string({ unit: 'binary', maxLength: 80 }),
  fc.integer(),
  fc.double(),
  fc.anything({ maxDepth: 2, maxKeys: 4 }),
)

export const hostileSegment: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom('0', '-1', '1.5', '1e308', '9'.repeat(400), '0x10', 'NaN', 'Infinity', '4294967296', '9007199254740993',
    '%00', '%E0%A4%A', '%FF', '1%27%20OR%20%271%27%3D%271', '%3Cscript%3E', ' 1', 'x'.repeat(300)),
  fc.string({ unit: 'binary', maxLength: 30 }).filter(s => s.length > 0).map(encodeURIComponent),
)

export const hostileQueryValue: fc.Arbitrary<string> = fc.oneof(
  hostileSegment.map(s => s),
  fc.string({ unit: 'binary', maxLength: 40 }).map(encodeURIComponent),
)

type Path = (string | number)[]

/** Every path into a JSON value (containers and leaves), the value itself excluded. */
export function pathsOf(value: unknown, prefix: Path = []): Path[] {
  if (value === null || typeof value !== 'object') return []
  const keys: (string | number)[] = Array.isArray(value) ? value.map((_, i) => i) : Object.keys(value)
  return keys.flatMap(k => [[...prefix, k], ...pathsOf((value as Record<string | number, unknown>)[k], [...prefix, k])])
}

/** A copy of `value` with the thing at `path` replaced (or removed when `replacement` is `remove`). */
export const remove = Symbol('remove')
export function withValueAt(value: unknown, path: Path, replacement: unknown): unknown {
  const copy = structuredClone(value) as Record<string | number, unknown>
  let parent = copy
  for (const key of path.slice(0, -1)) parent = parent[key] as Record<string | number, unknown>
  const last = path[path.length - 1]!
  if (replacement === remove) {
    if (Array.isArray(parent)) parent.splice(last as number, 1)
    else Reflect.deleteProperty(parent, last)
  }
  else parent[last] = replacement
  return copy
}

/** A valid body with one thing broken: a value replaced or removed, or the whole body replaced. */
export function brokenBody(valid: unknown): fc.Arbitrary<unknown> {
  const paths = pathsOf(valid)
  if (paths.length === 0) return hostileValue
  const path = fc.constantFrom(...paths)
  return fc.oneof(
    fc.tuple(path, hostileValue).map(([p, v]) => withValueAt(valid, p, v)),
    path.map(p => withValueAt(valid, p, remove)),
    hostileValue,
  )
}
