import { describe, expect, it } from 'vitest'
import { copySuffix, longestPieceName } from '#shared/piece/copies'
import { nameWithSuffix } from '#shared/text/nameWithSuffix'

describe('copies of a plan piece', () => {
  it.each([
    [1, '', 120],
    [2, ' 2 of 2', 113],
    [9, ' 9 of 9', 113],
    [10, ' 10 of 10', 111],
  ])('%i copies: the last is "<name>%s", so the name may have %i characters', (copies, last, longest) => {
    expect(copySuffix(copies, copies)).toBe(last)
    expect(longestPieceName(copies)).toBe(longest)
    expect(nameWithSuffix('x'.repeat(longest), last)).toHaveLength(longest + last.length)
  })
})
