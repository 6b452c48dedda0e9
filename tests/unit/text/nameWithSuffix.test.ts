import { describe, expect, it } from 'vitest'
import { NAME_MAX, nameWithSuffix } from '#shared/text/nameWithSuffix'

const studio = '’s studio'

describe('nameWithSuffix', () => {
  it.each([
    ['a name that fits is kept whole', 'x'.repeat(111), 'x'.repeat(111) + studio],
    ['one character over: cut with an ellipsis to exactly the limit', 'x'.repeat(112), `${'x'.repeat(110)}…${studio}`],
    ['the longest name allowed', 'x'.repeat(120), `${'x'.repeat(110)}…${studio}`],
    ['no space is left before the ellipsis', `${'x'.repeat(109)} yyyyyyyyyy`, `${'x'.repeat(109)}…${studio}`],
  ])('%s', (_, name, expected) => {
    const result = nameWithSuffix(name, studio)
    expect(result).toBe(expected)
    expect(result.length).toBeLessThanOrEqual(NAME_MAX)
  })

  it('never splits an emoji or an accent made of two code points', () => {
    const family = '👩‍👩‍👧' // one grapheme, 8 UTF-16 units
    const accent = 'e\u0301' // é as e + combining acute
    for (const unit of [family, accent, '😀']) {
      for (let n = 100; n <= 120; n++) {
        const name = unit.repeat(Math.ceil(n / unit.length)).slice(0, Math.floor(n / unit.length) * unit.length)
        const result = nameWithSuffix(name, studio)
        expect(result.length).toBeLessThanOrEqual(NAME_MAX)
        const kept = result.slice(0, -studio.length).replace(/…$/, '')
        expect(kept.length % unit.length, `${unit} × ${n}`).toBe(0)
        expect(name.startsWith(kept)).toBe(true)
      }
    }
  })
})
