// Punch cards, worked by hand before the code (charts written first row knitted first, as chartFromRows reads them):
//
// 1. Chart 4 × 3: 'x...', '.x..', '..xx' on a 24-needle card, minRows 60, joinRows 2.
//    repeatsAcross = 24 / 4 = 6. repeatsDown: 19 × 3 = 57 < 60, 20 × 3 = 60 ≥ 60 → 20. rows = 60 + 2 = 62.
//    Card row 0 = 'x...' six times = 'x...x...x...x...x...x...'; row 59 = chart row 59 mod 3 = 2 → '..xx' × 6;
//    row 60 (first join row) = chart row 0 = card row 0; row 61 = chart row 1 = card row 1 = '.x..' × 6.
//    minRows 61 → 21 repeats (63 rows) + 2 = 65 rows. minRows 1 → 1 repeat, 3 + 2 = 5 rows, rows 3 and 4 = rows 0 and 1.
// 2. A 5-wide chart on 24 needles is refused (field `width`). The divisors of 24 are 1 2 3 4 6 8 12 24; their distances
//    from 5 are 4 3 2 1 1 3 7 19, so nearest first (the narrower of two equally near first):
//    4, 6, 3, 2, 8, 1, 12, 24. 24 on 24 fits: 24, 12, 8, 6, 4, 3, 2, 1. 30 on 24 (wider than the card): 24, 12, 8, …, 1.
//    4 on 24 (distances 3 2 1 0 2 4 8 20): 4, 3, 2, 6, 1, 8, 12, 24.
//    7 on 40 (divisors 1 2 4 5 8 10 20 40; distances 6 5 3 2 1 3 13 33): 8, 5, 4, 10, 2, 1, 20, 40.
// 3. Otsu (1979) on a photo grid 3 × 2, darkness top row first: [40, 200, 40, / 200, 200, 40]. Two levels, three cells
//    each; every t from 40 to 199 splits them alike, the tie rule takes t = 40; levels > 40 are dark = holes = contrast.
//    Photo top row → chart row 1 (last knitted), mirrored (photo x → chart column 2 − x): 40 200 40 → '.x.';
//    photo row 2 200 200 40 → chart row 0: columns 2, 1, 0 = x, x, . → '.xx'. So chartToRows = ['.xx', '.x.'];
//    inverted ['x..', 'x.x']; with threshold 220 nothing is dark: ['...', '...'].
//    Noisy levels 30 50 (card) and 190 210 (holes), one of each per row of a 2 × 2 photo [30, 190, / 210, 50]:
//    t = 50 (the lower class ends at 50); row 1 (top) → chart row 1: x=1 dark → column 0 → 'x.'; row 2: x=0 dark → column 1 → '.x'.
//    chartToRows = ['.x', 'x.'].
// 4. An "F" drawn top down  xxx / x.. / xx. / x..  is the chart 'x..', 'xx.', 'x..', 'xxx' (3 × 4). On a 3-needle card,
//    minRows 4, joinRows 0, holes = the chart. As punched, each row mirrored: '..x', '.xx', '..x', 'xxx' — the F mirrored.
//    The chart's left edge (column 0, all holes) is the punched card's right edge: atMachine('left') = 'right'.
// 5. Chart 'xxxx', 'x...', '....' on 8 needles, minRows 3, joinRows 1 → 4 rows: row 0 all holes, 1 mixed, 2 none,
//    3 = row 0. Main unused (punched across): rows 0 and 3; contrast unused (no hole): row 2.
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  atMachine, blankCardRows, cardAsPunched, cardFromGrid, cardWidthFits, chartFromRows, chartToRows, punchCard,
} from '#shared/engine'
import type { CardHoles, Chart } from '#shared/engine'
import { chartArb, inputError } from './helpers'

/** Card rows as text, first row knitted first ('x' punched). */
function cardRows(card: CardHoles): string[] {
  return chartToRows({ width: card.width, height: card.rows, cells: card.holes })
}

const example = chartFromRows(['x...', '.x..', '..xx'])

describe('punchCard — hand-worked examples (header 1)', () => {
  it('repeats a 4 × 3 chart over a 24-needle card of at least 60 rows and two join rows', () => {
    const card = punchCard(example, { width: 24, minRows: 60, joinRows: 2 })
    expect(card.repeatsAcross).toBe(6)
    expect(card.repeatsDown).toBe(20)
    expect(card.rows).toBe(62)
    expect(card.width).toBe(24)
    expect(card.holes.length).toBe(62 * 24)
    const rows = cardRows(card)
    expect(rows[0]).toBe('x...x...x...x...x...x...')
    expect(rows[59]).toBe('..xx'.repeat(6))
    expect(rows[60]).toBe(rows[0])
    expect(rows[61]).toBe('.x..'.repeat(6))
  })

  it.each([
    // [minRows, joinRows, repeatsDown, rows, source]
    [60, 2, 20, 62, 'by hand: 20 × 3 = 60 exactly'],
    [61, 2, 21, 65, 'by hand: 20 × 3 = 60 < 61, so 21 repeats'],
    [58, 0, 20, 60, 'by hand: 19 × 3 = 57 < 58'],
    [1, 2, 1, 5, 'by hand: one repeat covers 1 row'],
    [3, 4, 1, 7, 'by hand: join rows longer than the loop keep repeating it'],
  ])('minRows %i, joinRows %i → %i repeats down, %i rows (%s)', (minRows, joinRows, repeatsDown, rows) => {
    const card = punchCard(example, { width: 24, minRows, joinRows })
    expect(card.repeatsDown).toBe(repeatsDown)
    expect(card.rows).toBe(rows)
    const text = cardRows(card)
    for (let j = 0; j < joinRows; j++) expect(text[repeatsDown * 3 + j]).toBe(text[j % 3])
  })

  it('refuses a 5-wide chart on 24 needles, naming width and offering the nearest widths (header 2)', () => {
    const e = inputError(() => punchCard(chartFromRows(['x....']), { width: 24, minRows: 10, joinRows: 2 }))
    expect(e.field).toBe('width')
    expect(e.message).toContain('4, 6, 3, 2')
  })

  it.each([
    ['card', null],
    ['width', { width: 0, minRows: 1, joinRows: 0 }],
    ['width', { width: 2.5, minRows: 1, joinRows: 0 }],
    ['minRows', { width: 24, minRows: 0, joinRows: 0 }],
    ['joinRows', { width: 24, minRows: 1, joinRows: -1 }],
    ['joinRows', { width: 24, minRows: 19998, joinRows: 10 }],
    ['minRows', { width: 24, minRows: 19999, joinRows: 0 }],
  ])('names %s when the card is %o', (field, card) => {
    expect(inputError(() => punchCard(example, card as never)).field).toBe(field)
  })

  it('refuses what is not a chart', () => {
    expect(inputError(() => punchCard({ width: 2, height: 1, cells: new Uint8Array([0, 2]) }, { width: 2, minRows: 1, joinRows: 0 })).field)
      .toBe('chart')
  })
})

describe('cardWidthFits — hand-worked examples (header 2)', () => {
  it.each([
    [5, 24, false, [4, 6, 3, 2, 8, 1, 12, 24]],
    [4, 24, true, [4, 3, 2, 6, 1, 8, 12, 24]],
    [24, 24, true, [24, 12, 8, 6, 4, 3, 2, 1]],
    [30, 24, false, [24, 12, 8, 6, 4, 3, 2, 1]],
    [7, 40, false, [8, 5, 4, 10, 2, 1, 20, 40]],
    [1, 1, true, [1]],
  ])('a %i-stitch repeat on %i needles: fits %s, divisors %o (by hand)', (chartWidth, cardWidth, fits, divisors) => {
    expect(cardWidthFits(chartWidth, cardWidth)).toEqual({ fits, divisors })
  })

  it.each([['chartWidth', 0, 24], ['cardWidth', 4, 0], ['chartWidth', Number.NaN, 24], ['cardWidth', 4, 1001]])(
    'names %s', (field, chartWidth, cardWidth) => {
      expect(inputError(() => cardWidthFits(chartWidth as number, cardWidth as number)).field).toBe(field)
    })
})

describe('cardFromGrid — hand-worked examples (header 3; threshold by Otsu 1979, published method)', () => {
  it.each<[number[], number, number, number | undefined, boolean, string[], string]>([
    // [darkness, cols, rows, threshold, invert, chart rows, source]
    [[40, 200, 40, 200, 200, 40], 3, 2, undefined, false, ['.xx', '.x.'], 'by hand: Otsu t = 40, dark = hole'],
    [[40, 200, 40, 200, 200, 40], 3, 2, undefined, true, ['x..', 'x.x'], 'by hand: the same, light holes'],
    [[40, 200, 40, 200, 200, 40], 3, 2, 220, false, ['...', '...'], 'by hand: nothing above 220'],
    [[40, 200, 40, 200, 200, 40], 3, 2, 39, false, ['xxx', 'xxx'], 'by hand: everything above 39'],
    [[30, 190, 210, 50], 2, 2, undefined, false, ['.x', 'x.'], 'by hand: noisy levels, t = 50'],
    [[127.5, 127.4], 2, 1, 127, false, ['.x'], 'by hand: 127.5 rounds up to 128 > 127, 127.4 to 127'],
    [[250, 250, 250, 250], 2, 2, undefined, false, ['xx', 'xx'], 'by hand: one level, Otsu falls back to 127 (picture.ts)'],
    [[5, 5], 2, 1, undefined, false, ['..'], 'by hand: one light level, nothing punched'],
  ])('%o (%i × %i, threshold %s, invert %s) → %o (%s)', (darkness, cols, rows, threshold, invert, expected) => {
    expect(chartToRows(cardFromGrid(darkness, cols, rows, threshold, invert))).toEqual(expected)
  })

  it.each([
    ['cols', () => cardFromGrid([0], 0, 1)],
    ['rows', () => cardFromGrid([0], 1, 1.5)],
    ['darkness', () => cardFromGrid([0, 0], 1, 1)],
    ['darkness', () => cardFromGrid([0, 256], 2, 1)],
    ['darkness', () => cardFromGrid([0, Number.NaN], 2, 1)],
    ['threshold', () => cardFromGrid([0, 0], 2, 1, 300)],
    ['invert', () => cardFromGrid([0, 0], 2, 1, undefined, 'yes' as never)],
  ])('names %s on bad input', (field, call) => {
    expect(inputError(call).field).toBe(field)
  })

  it('says where a bad value is, counted from the photo\'s top row', () => {
    const e = inputError(() => cardFromGrid([0, 0, 0, -1], 2, 2))
    expect([e.row, e.col]).toEqual([2, 2])
  })
})

describe('cardAsPunched — the card as printed (header 4; common practice: the knitter faces the purl side)', () => {
  const f = chartFromRows(['x..', 'xx.', 'x..', 'xxx'])

  it('mirrors an F left to right, rows in the same order', () => {
    const card = punchCard(f, { width: 3, minRows: 4, joinRows: 0 })
    expect(cardRows(card)).toEqual(['x..', 'xx.', 'x..', 'xxx'])
    const punched = cardAsPunched(card)
    expect(cardRows(punched)).toEqual(['..x', '.xx', '..x', 'xxx'])
    expect(punched.repeatsAcross).toBe(1)
    expect(punched.repeatsDown).toBe(1)
  })

  it('puts the chart\'s left edge where atMachine puts the knit side\'s left: on the right', () => {
    const punched = cardAsPunched(punchCard(f, { width: 3, minRows: 4, joinRows: 0 }))
    const edge = atMachine('left') === 'right' ? punched.width - 1 : 0
    for (let r = 0; r < punched.rows; r++) expect(punched.holes[r * punched.width + edge]).toBe(1)
  })

  it('reads back from a photo of the printed card as the chart it came from', () => {
    const card = punchCard(f, { width: 6, minRows: 4, joinRows: 0 })
    const punched = cardAsPunched(card)
    // The photo: the printed card, its top row (the last knitted) first; holes dark on a dark backing.
    const darkness: number[] = []
    for (let y = 0; y < punched.rows; y++) {
      for (let x = 0; x < punched.width; x++) darkness.push(punched.holes[(punched.rows - 1 - y) * punched.width + x] ? 220 : 30)
    }
    expect(chartToRows(cardFromGrid(darkness, punched.width, punched.rows))).toEqual(cardRows(card))
  })

  it('refuses holes that do not match the size', () => {
    expect(inputError(() => cardAsPunched({ width: 2, rows: 2, holes: new Uint8Array(3) })).field).toBe('holes')
    expect(inputError(() => cardAsPunched({ width: 2, rows: 1, holes: new Uint8Array([0, 3]) })).col).toBe(2)
    expect(inputError(() => cardAsPunched({ width: 2, rows: 0, holes: new Uint8Array(0) })).field).toBe('rows')
  })
})

describe('blankCardRows — rows where a yarn knits nothing (header 5; floats.ts unused rows)', () => {
  it('names rows punched right across and rows with no hole, join rows included', () => {
    const card = punchCard(chartFromRows(['xxxx', 'x...', '....']), { width: 8, minRows: 3, joinRows: 1 })
    expect(blankCardRows(card)).toEqual({ mainUnused: [0, 3], contrastUnused: [2] })
  })

  it('is empty when both yarns knit on every row', () => {
    expect(blankCardRows(punchCard(example, { width: 24, minRows: 60, joinRows: 2 }))).toEqual({ mainUnused: [], contrastUnused: [] })
  })
})

// Property tests against brute force.
const cardArb = fc.record({
  chart: chartArb(8, 6),
  across: fc.integer({ min: 1, max: 4 }),
  minRows: fc.integer({ min: 1, max: 40 }),
  joinRows: fc.integer({ min: 0, max: 6 }),
})

describe('punchCard — properties', () => {
  it('carries chart column c mod width and chart row r mod height in every cell', () => {
    fc.assert(fc.property(cardArb, ({ chart, across, minRows, joinRows }) => {
      const card = punchCard(chart, { width: chart.width * across, minRows, joinRows })
      for (let r = 0; r < card.rows; r++) {
        for (let c = 0; c < card.width; c++) {
          expect(card.holes[r * card.width + c]).toBe(chart.cells[(r % chart.height) * chart.width + (c % chart.width)])
        }
      }
    }))
  })

  it('gives the chart back from its first chart height of rows and chart width of columns', () => {
    fc.assert(fc.property(cardArb, ({ chart, across, minRows, joinRows }) => {
      const card = punchCard(chart, { width: chart.width * across, minRows, joinRows })
      const back = new Uint8Array(chart.width * chart.height)
      for (let r = 0; r < chart.height; r++) {
        for (let c = 0; c < chart.width; c++) back[r * chart.width + c] = card.holes[r * card.width + c]!
      }
      expect(back).toEqual(chart.cells)
    }))
  })

  it('is the fewest whole repeats covering minRows, then the join rows, which repeat the first rows', () => {
    fc.assert(fc.property(cardArb, ({ chart, across, minRows, joinRows }) => {
      const card = punchCard(chart, { width: chart.width * across, minRows, joinRows })
      const loop = card.repeatsDown * chart.height
      expect(loop).toBeGreaterThanOrEqual(minRows)
      expect(loop - chart.height).toBeLessThan(minRows)
      expect(card.rows).toBe(loop + joinRows)
      expect(card.repeatsAcross * chart.width).toBe(card.width)
      expect(card.holes.subarray(loop * card.width)).toEqual(card.holes.subarray(0, joinRows * card.width))
    }))
  })

  it('refuses exactly the widths the repeat does not divide; the divisors are every fitting width, nearest first', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 60 }), fc.integer({ min: 1, max: 60 }), (chartWidth, cardWidth) => {
      const fit = cardWidthFits(chartWidth, cardWidth)
      expect(fit.fits).toBe(cardWidth % chartWidth === 0)
      const all = Array.from({ length: cardWidth }, (_, i) => i + 1).filter(d => cardWidth % d === 0)
      expect([...fit.divisors].sort((a, b) => a - b)).toEqual(all)
      const gaps = fit.divisors.map(d => Math.abs(d - chartWidth))
      expect(gaps).toEqual([...gaps].sort((a, b) => a - b))
      const chart: Chart = { width: chartWidth, height: 1, cells: new Uint8Array(chartWidth) }
      if (fit.fits) expect(punchCard(chart, { width: cardWidth, minRows: 1, joinRows: 0 }).repeatsAcross).toBe(cardWidth / chartWidth)
      else expect(inputError(() => punchCard(chart, { width: cardWidth, minRows: 1, joinRows: 0 })).field).toBe('width')
    }))
  })

  it('lists as blank exactly the rows brute force finds with one colour only', () => {
    fc.assert(fc.property(cardArb, ({ chart, across, minRows, joinRows }) => {
      const card = punchCard(chart, { width: chart.width * across, minRows, joinRows })
      const mainUnused: number[] = []
      const contrastUnused: number[] = []
      for (let r = 0; r < card.rows; r++) {
        const row = [...card.holes.subarray(r * card.width, (r + 1) * card.width)]
        if (row.every(h => h === 1)) mainUnused.push(r)
        if (row.every(h => h === 0)) contrastUnused.push(r)
      }
      expect(blankCardRows(card)).toEqual({ mainUnused, contrastUnused })
    }))
  })
})

describe('cardAsPunched — properties', () => {
  it('twice is the identity, and once puts card column c at width − 1 − c', () => {
    fc.assert(fc.property(cardArb, ({ chart, across, minRows, joinRows }) => {
      const card = punchCard(chart, { width: chart.width * across, minRows, joinRows })
      const once = cardAsPunched(card)
      expect(cardAsPunched(once)).toEqual(card)
      for (let r = 0; r < card.rows; r++) {
        for (let c = 0; c < card.width; c++) expect(once.holes[r * card.width + card.width - 1 - c]).toBe(card.holes[r * card.width + c])
      }
    }))
  })
})

// A photo grid rendered from known holes: holes at 200 ± 20 on a card at 40 ± 20 (the levels, rounded by cardFromGrid,
// of dark holes on a light card), or the other way round with `invert`. Otsu (1979) separates the two bands when the
// fewer of the two kinds of cell are at least a twentieth of the grid. With fewer, the spread of the larger band can
// outweigh the gap (Otsu's known weakness with very unequal classes: by brute force over the worst spread, one hole
// among 50 cells, or 13 among 480, is split wrongly), and a photo of one kind only (no hole at all, or punched right
// across) has no two bands to split; then the knitter gives the threshold (the second property).
const photoArb = fc.record({ cols: fc.integer({ min: 1, max: 24 }), rows: fc.integer({ min: 1, max: 20 }) })
  .chain(({ cols, rows }) => fc.record({
    cols: fc.constant(cols),
    rows: fc.constant(rows),
    holes: fc.array(fc.boolean(), { minLength: cols * rows, maxLength: cols * rows }),
    noise: fc.array(fc.double({ min: -20, max: 20, noNaN: true }), { minLength: cols * rows, maxLength: cols * rows }),
  }))

function expectedChart(holes: boolean[], cols: number, rows: number): Uint8Array {
  const cells = new Uint8Array(cols * rows)
  for (let y = 0; y < rows; y++) for (let x = 0; x < cols; x++) cells[(rows - 1 - y) * cols + (cols - 1 - x)] = holes[y * cols + x] ? 1 : 0
  return cells
}

const minority = (holes: boolean[]) => Math.min(holes.filter(Boolean).length, holes.filter(h => !h).length)

describe('cardFromGrid — properties (Otsu 1979)', () => {
  it('reads every cell of dark holes on a light card, and of light holes with invert', () => {
    fc.assert(fc.property(photoArb, ({ cols, rows, holes, noise }) => {
      const n = cols * rows
      fc.pre(minority(holes) * 20 >= n)
      const dark = holes.map((h, i) => (h ? 200 : 40) + noise[i]!)
      const light = holes.map((h, i) => (h ? 40 : 200) + noise[i]!)
      const expected = expectedChart(holes, cols, rows)
      expect(cardFromGrid(dark, cols, rows).cells).toEqual(expected)
      expect(cardFromGrid(light, cols, rows, undefined, true).cells).toEqual(expected)
    }))
  })

  it('reads a photo of any printed card back as the card (printed mirrored, photographed top row first)', () => {
    fc.assert(fc.property(cardArb, ({ chart, across, minRows, joinRows }) => {
      const card = punchCard(chart, { width: chart.width * across, minRows, joinRows })
      const punched = cardAsPunched(card)
      const darkness: number[] = []
      for (let y = 0; y < punched.rows; y++) {
        for (let x = 0; x < punched.width; x++) darkness.push(punched.holes[(punched.rows - 1 - y) * punched.width + x] ? 210 : 35)
      }
      expect(cardFromGrid(darkness, card.width, card.rows).cells).toEqual(card.holes)
    }))
  })

  it('reads every cell, whatever the share of holes, with a threshold between the bands', () => {
    fc.assert(fc.property(photoArb, fc.integer({ min: 60, max: 179 }), ({ cols, rows, holes, noise }, threshold) => {
      const dark = holes.map((h, i) => (h ? 200 : 40) + noise[i]!)
      expect(cardFromGrid(dark, cols, rows, threshold).cells).toEqual(expectedChart(holes, cols, rows))
    }))
  })
})
