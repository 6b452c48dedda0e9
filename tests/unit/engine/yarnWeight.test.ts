import { describe, expect, it } from 'vitest'
import { YARN_WEIGHT_CATEGORIES, yarnWeightCategory } from '#shared/engine'
import { inputError } from './helpers'

// Craft Yarn Council, "Standard Yarn Weight System", knit gauge in stockinette, sts per 4 in.
describe('Craft Yarn Council categories', () => {
  it.each([
    // category, name, min, max, source — tag
    [2, 'Fine', 23, 26, 'REFERENCES.md — published'],
    [3, 'Light', 21, 24, 'REFERENCES.md — published'],
    [4, 'Medium', 16, 20, 'REFERENCES.md — published'],
    [5, 'Bulky', 12, 15, 'REFERENCES.md — published'],
    [0, 'Lace', 33, 40, 'CYC chart as reproduced on hertzoffjo.blogspot.com (2019) — published'],
    [1, 'Super Fine', 27, 32, 'CYC chart as reproduced on hertzoffjo.blogspot.com (2019) — published'],
    [6, 'Super Bulky', 7, 11, 'from memory (current chart; older charts say 6–11)'],
    [7, 'Jumbo', 0, 6, 'from memory ("6 sts and fewer")'],
  ])('category %i %s: %i–%i sts (%s)', (category, name, min, max) => {
    expect(YARN_WEIGHT_CATEGORIES[category]).toEqual({ category, name, minStitches: min, maxStitches: max })
    expect(yarnWeightCategory(max)?.category === category || yarnWeightCategory(max)?.alsoFits.includes(category)).toBe(true)
    if (min > 0) expect(yarnWeightCategory(min)?.category === category || yarnWeightCategory(min)?.alsoFits.includes(category)).toBe(true)
  })

  it.each([
    // gauge, category, alsoFits, tag
    [18, 4, [], 'REFERENCES.md — published (Medium 16–20)'],
    [22, 3, [], 'REFERENCES.md — published (Light 21–24)'],
    [25, 2, [], 'REFERENCES.md — published (Fine 23–26)'],
    [23, 2, [3], 'declared tie rule: overlap → the finer category, the other in alsoFits'],
    [24, 2, [3], 'declared tie rule'],
    [14, 5, [], 'REFERENCES.md — published (Bulky 12–15)'],
    [30, 1, [], 'published (CYC chart reproduction)'],
    [36, 0, [], 'published (CYC chart reproduction)'],
    [9, 6, [], 'from memory'],
    [4, 7, [], 'from memory'],
    [20.4, 4, [], 'declared: round to nearest whole stitch first'],
    [20.5, 3, [], 'declared: half rounds up'],
    [26.5, 1, [], 'declared'],
  ])('%s sts per 4 in → category %i, also %j (%s)', (gauge, category, alsoFits) => {
    expect(yarnWeightCategory(gauge)).toMatchObject({ category, alsoFits })
  })

  it('gives no category finer than Lace', () => {
    expect(yarnWeightCategory(41)).toBeNull()
  })

  it.each([[0], [-3], [Number.NaN]])('rejects %s', (g) => {
    expect(inputError(() => yarnWeightCategory(g)).field).toBe('stitchesPer4in')
  })
})
