// Yarn weight category from a stockinette gauge: the Craft Yarn Council's
// Standard Yarn Weight System, categories 0–7, knit gauge ranges in
// stitches per 4 in. The table gives no row gauge and no yardage.
//
// Declared rules:
// - The gauge is first rounded to the nearest whole stitch per 4 in (half up),
//   since the table lists whole stitches; so 20.5 falls in Light, 20.4 in Medium.
// - The ranges overlap at 23–24 (Fine and Light): the finer category (more
//   stitches, lower number) is returned and the other is listed in alsoFits.
// - Jumbo is "6 sts and fewer"; beyond 40 sts no category fits (null).

import { roundHalfUp } from './gauge'
import { requirePositive } from './validate'

export interface YarnWeightCategory {
  category: number
  name: string
  /** Stitches per 4 in, inclusive; min 0 means "and fewer". */
  minStitches: number
  maxStitches: number
}

export const YARN_WEIGHT_CATEGORIES: readonly YarnWeightCategory[] = Object.freeze([
  { category: 0, name: 'Lace', minStitches: 33, maxStitches: 40 },
  { category: 1, name: 'Super Fine', minStitches: 27, maxStitches: 32 },
  { category: 2, name: 'Fine', minStitches: 23, maxStitches: 26 },
  { category: 3, name: 'Light', minStitches: 21, maxStitches: 24 },
  { category: 4, name: 'Medium', minStitches: 16, maxStitches: 20 },
  { category: 5, name: 'Bulky', minStitches: 12, maxStitches: 15 },
  { category: 6, name: 'Super Bulky', minStitches: 7, maxStitches: 11 },
  { category: 7, name: 'Jumbo', minStitches: 0, maxStitches: 6 },
])

export interface YarnWeightMatch {
  category: number
  name: string
  /** Other categories whose range also holds this gauge (the overlap 23–24). */
  alsoFits: number[]
}

/** The yarn weight category for a stockinette gauge in stitches per 4 in, or null past 40. */
export function yarnWeightCategory(stitchesPer4in: number): YarnWeightMatch | null {
  const st = roundHalfUp(requirePositive(stitchesPer4in, 'stitchesPer4in'))
  const fits = YARN_WEIGHT_CATEGORIES.filter(c => st >= c.minStitches && st <= c.maxStitches)
  if (fits.length === 0) return null
  // The table runs finest first, so fits[0] is the finer category.
  return { category: fits[0]!.category, name: fits[0]!.name, alsoFits: fits.slice(1).map(c => c.category) }
}
