import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { PNG } from 'pngjs'
import { areaAverage, imageToChart, otsuThreshold, PICTURE_LIMITS } from '#shared/engine/picture'
import { KnittingInputError } from '#shared/engine/errors'
import type { Chart } from '#shared/engine/types'

/** Chart rows as strings, drawn as on paper: top line = last row knitted. */
function drawn(chart: Chart): string[] {
  const lines: string[] = []
  for (let row = chart.height - 1; row >= 0; row--) {
    let line = ''
    for (let col = 0; col < chart.width; col++) line += chart.cells[row * chart.width + col] ? '#' : '.'
    lines.push(line)
  }
  return lines
}

/** RGBA picture from lines drawn top first: '#' black, '.' white, ' ' transparent, 'g' grey 128. */
function picture(lines: string[]): { rgba: Uint8Array; width: number; height: number } {
  const height = lines.length
  const width = lines[0]!.length
  const rgba = new Uint8Array(width * height * 4)
  const ink: Record<string, [number, number, number, number]> = {
    '#': [0, 0, 0, 255], '.': [255, 255, 255, 255], ' ': [0, 0, 0, 0], 'g': [128, 128, 128, 255],
  }
  lines.forEach((line, y) => [...line].forEach((ch, x) => rgba.set(ink[ch]!, (y * width + x) * 4)))
  return { rgba, width, height }
}

describe('areaAverage (exact fractional coverage)', () => {
  it.each([
    // [values, srcW, srcH, dstW, dstH, expected, source]
    [[0, 10, 20, 30, 40, 50], 6, 1, 3, 1, [5, 25, 45], 'resampling conventions (REFERENCES, published example)'],
    [[0, 10, 20, 30, 40, 50], 6, 1, 4, 1, [10 / 3, 50 / 3, 100 / 3, 140 / 3], 'by hand: each cell covers 1.5 pixels'],
    [[0, 10, 20, 30, 40, 50], 1, 6, 1, 3, [5, 25, 45], 'the same example down a column'],
    [[0, 10, 20, 30, 40, 50], 6, 1, 1, 1, [25], 'by hand: one cell is the mean'],
    [[0, 100], 2, 1, 4, 1, [0, 0, 100, 100], 'by hand: growing repeats each pixel'],
    [[0, 30, 60], 3, 1, 2, 1, [10, 50], 'by hand: (0 + 30/2) / 1.5 and (30/2 + 60) / 1.5'],
    [[0, 0, 90, 0, 0, 90, 90, 90, 90], 3, 3, 2, 2, [0, 60, 60, 80], 'by hand: 2-D weights are the overlap areas, e.g. (90 + 90·0.5) / 2.25 = 60'],
  ])('%j (%i×%i) → %i×%i — %s', (values, sw, sh, dw, dh, expected) => {
    const out = areaAverage(values, sw, sh, dw, dh)
    expect(out.length).toBe(expected.length)
    expected.forEach((v, i) => expect(out[i]).toBeCloseTo(v, 10))
  })

  it('keeps the mean of the picture (every source pixel is counted once in all)', () => {
    const grid = fc.record({ sw: fc.integer({ min: 1, max: 12 }), sh: fc.integer({ min: 1, max: 12 }) })
      .chain(({ sw, sh }) => fc.record({
        sw: fc.constant(sw), sh: fc.constant(sh),
        dw: fc.integer({ min: 1, max: 12 }), dh: fc.integer({ min: 1, max: 12 }),
        values: fc.array(fc.integer({ min: 0, max: 255 }), { minLength: sw * sh, maxLength: sw * sh }),
      }))
    fc.assert(fc.property(grid, ({ sw, sh, dw, dh, values }) => {
      const out = areaAverage(values, sw, sh, dw, dh)
      const mean = (xs: ArrayLike<number>) => Array.from(xs).reduce((s, v) => s + v, 0) / xs.length
      expect(mean(out)).toBeCloseTo(mean(values), 8)
      for (const v of out) {
        expect(v).toBeGreaterThanOrEqual(Math.min(...values) - 1e-9)
        expect(v).toBeLessThanOrEqual(Math.max(...values) + 1e-9)
      }
    }), { numRuns: 300 })
  })

  it('rejects a value count that does not match the size', () => {
    expect(() => areaAverage([1, 2, 3], 2, 2, 1, 1)).toThrowError('values: expected 4 numbers (2 × 2), got 3')
  })
})

describe('otsuThreshold (Otsu 1979)', () => {
  /** Brute force: try every split, compute between-class variance from its definition. */
  function bruteForceSplits(histogram: number[]): { t: number; variance: number }[] {
    const total = histogram.reduce((s, c) => s + c, 0)
    const result = []
    for (let t = 0; t < histogram.length - 1; t++) {
      let w0 = 0, m0 = 0, w1 = 0, m1 = 0
      histogram.forEach((count, level) => {
        if (level <= t) { w0 += count; m0 += level * count }
        else { w1 += count; m1 += level * count }
      })
      if (w0 === 0 || w1 === 0) continue
      const mu0 = m0 / w0, mu1 = m1 / w1
      result.push({ t, variance: (w0 / total) * (w1 / total) * (mu0 - mu1) ** 2 })
    }
    return result
  }
  /** Which occupied levels fall in the dark class for threshold t. */
  const darkLevels = (histogram: number[], t: number) =>
    histogram.flatMap((count, level) => (count > 0 && level <= t ? [level] : []))

  function bimodal(): number[] {
    const h = new Array<number>(256).fill(0)
    for (let level = 0; level < 256; level++) {
      h[level] = Math.round(1000 * Math.exp(-(((level - 60) / 12) ** 2)) + 600 * Math.exp(-(((level - 190) / 20) ** 2)))
    }
    return h
  }

  it('splits an obvious bimodal histogram between the modes, as the brute force does (published method, Otsu 1979)', () => {
    const h = bimodal()
    const t = otsuThreshold(h)
    const splits = bruteForceSplits(h)
    const best = splits.reduce((a, b) => (b.variance > a.variance ? b : a))
    expect(darkLevels(h, t)).toEqual(darkLevels(h, best.t))
    expect(t).toBeGreaterThan(90)
    expect(t).toBeLessThan(150)
  })

  it('matches the brute-force maximiser on random histograms (the split, not the number)', () => {
    fc.assert(fc.property(fc.array(fc.nat(50), { minLength: 2, maxLength: 40 }), (h) => {
      fc.pre(h.filter(c => c > 0).length >= 2)
      const t = otsuThreshold(h)
      const splits = bruteForceSplits(h)
      const best = Math.max(...splits.map(s => s.variance))
      const ours = splits.find(s => s.t === t)!
      expect(ours.variance).toBeCloseTo(best, 9)
      const maximisers = splits.filter(s => Math.abs(s.variance - best) <= 1e-9 * best)
      const distinctSplits = new Set(maximisers.map(s => darkLevels(h, s.t).join(',')))
      if (distinctSplits.size === 1) expect(darkLevels(h, t)).toEqual(darkLevels(h, maximisers[0]!.t))
    }), { numRuns: 500 })
  })

  /** A 256-bin histogram with every pixel at one level. */
  const onlyLevel = (level: number) => Object.assign(new Array<number>(256).fill(0), { [level]: 9 })

  it.each([
    // [histogram, t, rule]
    [[5, 5, 0, 0, 0, 5, 5], 1, 'our tie rule: in a run of empty bins, t is the last occupied dark level'],
    [[1, 0, 1, 0, 1], 0, 'our tie rule: {0}|{2,4} and {0,2}|{4} score the same; the smallest t wins'],
    [[0, 0, 7, 0, 0], 2, 'our rule: one occupied level, t = ⌊(5 − 1)/2⌋ = 2'],
    [onlyLevel(0), 127, 'our rule: a uniformly black picture is all dark'],
    [onlyLevel(255), 127, 'our rule: a uniformly white picture is all light'],
    [[3, 1], 0, 'two bins: the only split'],
  ] as [number[], number, string][])('%j → %i — %s', (h, t) => {
    expect(otsuThreshold(h)).toBe(t)
  })

  it.each([
    [[], 'histogram: expected at least 2 bins, got 0'],
    [[0, 0, 0], 'histogram: all counts are zero'],
    [[1, -1, 2], 'histogram[1]: expected a count ≥ 0, got -1'],
    [[1, Number.NaN], 'histogram[1]: expected a count ≥ 0, got NaN'],
  ])('rejects %j', (h, message) => {
    expect(() => otsuThreshold(h)).toThrowError(KnittingInputError)
    expect(() => otsuThreshold(h)).toThrowError(message)
  })
})

describe('imageToChart', () => {
  it('puts the picture\'s top row at the top of the chart (last row knitted) and its left column at col 0', () => {
    const { rgba, width, height } = picture([
      '#...',
      '##..',
      '....',
    ])
    const chart = imageToChart(rgba, width, height, { width: 4, height: 3 })
    expect(drawn(chart)).toEqual(['#...', '##..', '....'])
    expect(chart.cells[(chart.height - 1) * chart.width + 0]).toBe(1) // top-left of the picture
    expect(Array.from(chart.cells.subarray(0, 4))).toEqual([0, 0, 0, 0]) // first row knitted = picture bottom
  })

  it('area-averages before thresholding', () => {
    const { rgba, width, height } = picture([
      '##..##',
      '##..#.',
    ])
    // cells: 2×2 blocks → 0, 255, 63.75 → Otsu puts 0 and 64 in the dark class
    expect(drawn(imageToChart(rgba, width, height, { width: 3, height: 1 }))).toEqual(['#.#'])
    expect(drawn(imageToChart(rgba, width, height, { width: 3, height: 1, threshold: 50 }))).toEqual(['#..'])
  })

  it('composites transparent pixels over white (declared: alpha 0 is white)', () => {
    const { rgba, width, height } = picture(['# ', ' #'])
    expect(drawn(imageToChart(rgba, width, height, { width: 2, height: 2 }))).toEqual(['#.', '.#'])
    // Half-transparent black over white: 255 · (1 − 128/255) = 127 → level 127.
    const half = new Uint8Array([0, 0, 0, 128])
    expect(imageToChart(half, 1, 1, { width: 1, height: 1, threshold: 127 }).cells[0]).toBe(1)
    expect(imageToChart(half, 1, 1, { width: 1, height: 1, threshold: 126 }).cells[0]).toBe(0)
  })

  it('inverts: dark becomes main colour', () => {
    const { rgba, width, height } = picture(['#.', '.#'])
    expect(drawn(imageToChart(rgba, width, height, { width: 2, height: 2, invert: true }))).toEqual(['.#', '#.'])
  })

  it('uses a given threshold on the averaged grey levels: level ≤ t is dark', () => {
    // A 16-step grey ramp 0, 17, …, 255 (one pixel each).
    const rgba = new Uint8Array(16 * 4)
    for (let i = 0; i < 16; i++) rgba.set([17 * i, 17 * i, 17 * i, 255], i * 4)
    expect(drawn(imageToChart(rgba, 16, 1, { width: 16, height: 1, threshold: 102 }))).toEqual(['#######.........'])
    expect(drawn(imageToChart(rgba, 16, 1, { width: 16, height: 1, threshold: 101 }))).toEqual(['######..........'])
    expect(drawn(imageToChart(rgba, 16, 1, { width: 16, height: 1, threshold: 0 }))).toEqual(['#...............'])
    expect(drawn(imageToChart(rgba, 16, 1, { width: 16, height: 1, threshold: 255 }))).toEqual(['################'])
  })

  it('weights grey by 0.2126 R + 0.7152 G + 0.0722 B on the 8-bit values', () => {
    const green = new Uint8Array([0, 255, 0, 255]) // grey 182.4 → level 182
    expect(imageToChart(green, 1, 1, { width: 1, height: 1, threshold: 182 }).cells[0]).toBe(1)
    expect(imageToChart(green, 1, 1, { width: 1, height: 1, threshold: 181 }).cells[0]).toBe(0)
    const blue = new Uint8Array([0, 0, 255, 255]) // grey 18.4 → level 18
    expect(imageToChart(blue, 1, 1, { width: 1, height: 1, threshold: 18 }).cells[0]).toBe(1)
    expect(imageToChart(blue, 1, 1, { width: 1, height: 1, threshold: 17 }).cells[0]).toBe(0)
  })

  it('turns a PNG built with pngjs (encoded, then decoded) into the expected chart', () => {
    // A 12×8 picture: a navy "L" on a transparent background, each chart cell 2×2 pixels.
    const design = [
      '#.....',
      '#.....',
      '#.....',
      '####..',
    ]
    const png = new PNG({ width: 12, height: 8 })
    png.data.fill(0) // fully transparent
    for (let y = 0; y < 8; y++) {
      for (let x = 0; x < 12; x++) {
        if (design[y >> 1]![x >> 1] === '#') png.data.set([20, 30, 90, 255], (y * 12 + x) * 4)
      }
    }
    const decoded = PNG.sync.read(PNG.sync.write(png))
    expect(decoded.width).toBe(12)
    const chart = imageToChart(decoded.data, decoded.width, decoded.height, { width: 6, height: 4 })
    expect(drawn(chart)).toEqual(design)
    // Same picture at a size that does not divide it evenly: 12×8 → 4×3 (3×2.67 px per cell).
    expect(drawn(imageToChart(decoded.data, 12, 8, { width: 4, height: 3, threshold: 200 }))).toEqual([
      '#...',
      '#...',
      '###.',
    ])
  })

  it.each([
    [4, 1, 16, { width: 0, height: 1 }, 'target width: expected a whole number from 1 to 200, got 0'],
    [4, 1, 16, { width: 201, height: 1 }, 'target width: expected a whole number from 1 to 200, got 201'],
    [4, 1, 16, { width: 2, height: 501 }, 'target height: expected a whole number from 1 to 500, got 501'],
    [4, 1, 16, { width: 2, height: 1.5 }, 'target height: expected a whole number from 1 to 500, got 1.5'],
    [4, 1, 15, { width: 2, height: 1 }, 'rgba: expected 16 values (4 × 1 pixels × 4 channels), got 15'],
    [4097, 1, 16, { width: 2, height: 1 }, 'picture width: expected a whole number from 1 to 4096, got 4097'],
    [4, 1, 16, { width: 2, height: 1, threshold: 300 }, 'target threshold: expected a number from 0 to 255, got 300'],
  ])('rejects a %i×%i picture of %i values with target %j', (w, h, length, target, message) => {
    const rgba = new Uint8Array(length).fill(255)
    expect(() => imageToChart(rgba, w, h, target)).toThrowError(KnittingInputError)
    expect(() => imageToChart(rgba, w, h, target)).toThrowError(message)
  })

  it('rejects channel values outside 0..255, saying which pixel', () => {
    const rgba = [255, 255, 255, 255, 0, 0, 256, 255]
    expect(() => imageToChart(rgba, 2, 1, { width: 1, height: 1 }))
      .toThrowError('rgba[6] (pixel x 1, y 0 from the top, B): expected a value from 0 to 255, got 256')
  })

  it('declares its limits', () => {
    expect(PICTURE_LIMITS).toEqual({ maxSourceWidth: 4096, maxSourceHeight: 4096, maxChartWidth: 200, maxChartHeight: 500 })
  })
})
