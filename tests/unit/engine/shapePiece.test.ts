import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { rowsForLength, shapePiece, spreadShaping, stitchesForWidth } from '#shared/engine'
import type { ShapedPiece, ShapedRow, ShapeSpec } from '#shared/engine'
import { inputError } from './helpers'
import { bodyArb, frontSpec, gaugeArb, sleeveSpec, specArb, tryShape } from '../../support/shapeSpecs'

// ---------------------------------------------------------------------------------------------
// Two pieces worked out by hand first, as a pattern sheet would give them (common practice:
// shaping made at the start of a row, cast-offs at the carriage side, slopes by the "magic
// formula" — Australian Knitting, "Knitting and the Magic Formula", published). Rows are
// machine rows counted from 0 after the cast-on; sides are seen from the knit side.
//
// (a) Front, round neck. Gauge 30 sts and 40 rows to 10 cm. Hem 50 cm, chest 54 cm, 36 cm to
//     the underarm, armholes: cast off 2 cm, decrease 1 cm, depth 20 cm; shoulders 16 cm,
//     drop 1.5 cm, cast off in steps; neck 16 cm wide, 8 cm deep. Carriage at the left.
//
//     Cast on 50 × 3 = 150 sts. Chest 54 × 3 = 162 sts: 12 more, 6 each side.
//     To the underarm 36 × 4 = 144 rows: 6 increases over 144 rows = every 24th row ×6.
//     Armhole 2 cm = 6 sts, 1 cm = 3 sts. Total 56 × 4 = 224 rows (rows 0–223).
//     Across the shoulders 162 − 12 − 6 = 144 sts; shoulders 16 × 3 = 48 sts each;
//     neck = 144 − 96 = 48 sts: round, ⌊48 / 4⌋ = 12 decreased each side, 24 at the centre.
//     Neck 8 × 4 = 32 rows, made 33 (each side an odd count: its last row starts from its
//     outer edge); neck starts on row 224 − 33 = 191, a carriage-right row.
//     Shoulder 1.5 × 4 = 6 rows → ⌊6 / 2⌋ + 1 = 4 steps of 12 sts.
//     Neck edge: 12 decreases over the 25 rows between the neck's first row and the shoulder
//     = every 2nd row ×11, every 3rd row ×1.
//
//     row   carriage  part    shaping before the row                          sts   held
//     0     left      whole   (cast on 150)                                   150   0
//     23    right     whole   inc 1 each end                                  152   0
//     47    right     whole   inc 1 each end                                  154   0
//     71    right     whole   inc 1 each end                                  156   0
//     95    right     whole   inc 1 each end                                  158   0
//     119   right     whole   inc 1 each end                                  160   0
//     143   right     whole   inc 1 each end                                  162   0
//     144   left      whole   cast off 6 at left                              156   0
//     145   right     whole   cast off 6 at right                             150   0
//     147   right     whole   dec 1 each end                                  148   0
//     149   right     whole   dec 1 each end                                  146   0
//     151   right     whole   dec 1 each end                                  144   0
//     191   right     right   cast off 24 at centre, 60 at left to holding     60   60
//     193…213 (odd)   right   dec 1 at neck edge (left) ×11                   49   60
//     216   left      right   dec 1 at neck edge (left)                        48   60
//     217   right     right   cast off 12 at right                             36   60
//     219   right     right   cast off 12 at right                             24   60
//     221   right     right   cast off 12 at right                             12   60
//     223   right     right   cast off 12 at right                              0   60
//     191   left      left    (left side back into work, yarn joined)          60    0
//     193…213 (odd)   left    dec 1 at neck edge (right) ×11                  49    0
//     216   right     left    dec 1 at neck edge (right)                       48    0
//     217…223 (odd)   left    cast off 12 at left ×4                           0    0
//     257 machine rows in all: 191 whole + 33 right + 33 left.
//
// (b) Set-in sleeve. Gauge 30 sts and 40 rows to 10 cm. Cuff 20 cm, upper arm 32 cm, 45 cm to
//     the underarm; cap: cast off 2 cm each side, 12 cm high, 8 cm across the top.
//     Carriage at the right.
//
//     Cast on 20 × 3 = 60 sts. Upper arm 32 × 3 = 96 sts: 18 each side over 45 × 4 = 180 rows
//     = every 10th row ×18. Cap 2 cm = 6 sts; total 57 × 4 = 228 rows (rows 0–227).
//     After the cap's cast-off 84 sts; top 8 × 3 = 24 sts: 30 decreases each side over rows
//     182–226 (45 rows) = every row ×15, every 2nd row ×15; the top cast off on row 227.
//
//     row   carriage  shaping before the row                                  sts
//     0     right     (cast on 60)                                             60
//     9, 19 … 179     inc 1 each end ×18 (carriage left on each)               96
//     180   right     cast off 6 at right                                      90
//     181   left      cast off 6 at left                                       84
//     182…196         dec 1 each end every row ×15                             54
//     198, 200 … 226  dec 1 each end every 2nd row ×15 (carriage right)        24
//     227   left      cast off 24 at left (the top)                             0
// ---------------------------------------------------------------------------------------------

const g30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }

/** One line of a sheet: a row with shaping (everything else on the row is 0). */
interface SheetRow {
  row: number
  co?: [number, number, number] // left, centre, right
  dec?: [number, number]
  inc?: [number, number]
}

/** A sheet segment: one part knitted over fabric rows from … to (inclusive). */
interface Segment { part: ShapedRow['part']; from: number; to: number; carriage: 'left' | 'right'; start: number; held: number; shaping: SheetRow[] }

/** Expand a sheet into every machine row: rows without a line are plain, the count carried on. */
function expandSheet(segments: Segment[]): ShapedRow[] {
  const out: ShapedRow[] = []
  for (const seg of segments) {
    let stitches = seg.start
    const byRow = new Map(seg.shaping.map(s => [s.row, s]))
    for (let r = seg.from; r <= seg.to; r++) {
      const line = byRow.get(r)
      const [cl, cc, cr] = line?.co ?? [0, 0, 0]
      const [dl, dr] = line?.dec ?? [0, 0]
      const [il, ir] = line?.inc ?? [0, 0]
      stitches += -cl - cc - cr - dl - dr + il + ir
      const flip = (r - seg.from) % 2 === 1
      out.push({
        part: seg.part,
        carriage: flip ? (seg.carriage === 'left' ? 'right' : 'left') : seg.carriage,
        stitches,
        held: seg.held,
        heldInPart: 0,
        heldAt: { left: 0, right: 0 },
        row: r,
        castOff: { left: cl, right: cr, centre: cc },
        decrease: { left: dl, right: dr },
        increase: { left: il, right: ir },
      })
    }
  }
  return out
}

const each = (rows: number[], line: Omit<SheetRow, 'row'>): SheetRow[] => rows.map(row => ({ row, ...line }))
const range = (from: number, to: number, step = 1) => Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step)

const neckDecreaseRows = [...range(193, 213, 2), 216]
const frontSheet: Segment[] = [
  {
    part: 'whole', from: 0, to: 190, carriage: 'left', start: 150, held: 0, shaping: [
      ...each([23, 47, 71, 95, 119, 143], { inc: [1, 1] }),
      { row: 144, co: [6, 0, 0] },
      { row: 145, co: [0, 0, 6] },
      ...each([147, 149, 151], { dec: [1, 1] }),
    ],
  },
  {
    part: 'right', from: 191, to: 223, carriage: 'right', start: 144 - 60, held: 60, shaping: [
      { row: 191, co: [0, 24, 0] },
      ...each(neckDecreaseRows, { dec: [1, 0] }),
      ...each([217, 219, 221, 223], { co: [0, 0, 12] }),
    ],
  },
  {
    part: 'left', from: 191, to: 223, carriage: 'left', start: 60, held: 0, shaping: [
      ...each(neckDecreaseRows, { dec: [0, 1] }),
      ...each([217, 219, 221, 223], { co: [12, 0, 0] }),
    ],
  },
]

const sleeveSheet: Segment[] = [
  {
    part: 'whole', from: 0, to: 227, carriage: 'right', start: 60, held: 0, shaping: [
      ...each(range(9, 179, 10), { inc: [1, 1] }),
      { row: 180, co: [0, 0, 6] },
      { row: 181, co: [6, 0, 0] },
      ...each([...range(182, 196), ...range(198, 226, 2)], { dec: [1, 1] }),
      { row: 227, co: [24, 0, 0] },
    ],
  },
]

describe('shapePiece — the hand-worked sheets (common practice; slopes by the magic formula — published)', () => {
  it('(a) front with a round neck, armholes and stepped shoulders: every row as on the sheet', () => {
    const piece = shapePiece(frontSpec, g30x40)
    expect(piece.castOn).toBe(150)
    expect(piece.rows).toHaveLength(257)
    expect(piece.rows).toEqual(expandSheet(frontSheet))
    expect(piece.leftOnNeedles).toBe(0)
    expect(piece.counts).toEqual({
      rowsToUnderarm: 144, rowsTotal: 224, width: 162, top: 144, shoulder: 48, neck: 48, neckCentre: 24, neckDecreases: 12, neckRows: 33,
    })
  })

  it('(a) the sheet\'s spot checks: the centre cast-off, the last neck decrease, the shoulder steps', () => {
    const rows = shapePiece(frontSpec, g30x40).rows
    expect(rows[191]).toMatchObject({ part: 'right', row: 191, carriage: 'right', stitches: 60, held: 60, castOff: { centre: 24, left: 0, right: 0 } })
    expect(rows[216 - 191 + 191]).toMatchObject({ part: 'right', row: 216, carriage: 'left', stitches: 48, decrease: { left: 1, right: 0 } })
    expect(rows.filter(r => r.part === 'right' && r.castOff.right > 0).map(r => [r.row, r.castOff.right, r.stitches]))
      .toEqual([[217, 12, 36], [219, 12, 24], [221, 12, 12], [223, 12, 0]])
    expect(rows[224]).toMatchObject({ part: 'left', row: 191, carriage: 'left', stitches: 60, held: 0 })
  })

  it('(b) set-in sleeve with a cap: every row as on the sheet', () => {
    const piece = shapePiece(sleeveSpec, g30x40)
    expect(piece.castOn).toBe(60)
    expect(piece.rows).toHaveLength(228)
    expect(piece.rows).toEqual(expandSheet(sleeveSheet))
    expect(piece.rows.at(-1)).toMatchObject({ carriage: 'left', stitches: 0, castOff: { left: 24, right: 0, centre: 0 } })
    expect(piece.counts).toMatchObject({ rowsToUnderarm: 180, rowsTotal: 228, width: 96, top: 24 })
  })
})

describe('shapePiece — the simplest shapes', () => {
  it.each([
    ['body 40 cm × 30 cm at 30 × 40', { kind: 'body', hemWidth: 40, lengthToUnderarm: 30 }, g30x40, 120, 120],
    ['body, width = hemWidth, carriage at the left', { kind: 'body', carriageStart: 'left', hemWidth: 40, width: 40, lengthToUnderarm: 30 }, g30x40, 120, 120],
    ['sleeve without a cap, no increases', { kind: 'sleeve', hemWidth: 25, width: 25, lengthToUnderarm: 10 }, { stitchesPer10cm: 22, rowsPer10cm: 31 }, 55, 31],
  ] as [string, ShapeSpec, { stitchesPer10cm: number; rowsPer10cm: number }, number, number][])(
    'a rectangle (%s): every row whole, stitches = castOn (common practice)',
    (_name, spec, gauge, castOn, rows) => {
      const piece = shapePiece(spec, gauge)
      expect(piece.castOn).toBe(castOn)
      expect(piece.rows).toHaveLength(rows)
      expect(rows).toBe(rowsForLength(spec.lengthToUnderarm, { ...gauge, stitchWidthMm: 0, rowHeightMm: 0 }))
      const start = spec.carriageStart ?? 'right'
      piece.rows.forEach((r, i) => {
        expect(r).toEqual({
          part: 'whole', carriage: i % 2 === 0 ? start : (start === 'left' ? 'right' : 'left'), stitches: castOn, held: 0, heldInPart: 0, heldAt: { left: 0, right: 0 }, row: i,
          castOff: { left: 0, right: 0, centre: 0 }, decrease: { left: 0, right: 0 }, increase: { left: 0, right: 0 },
        })
      })
      expect(piece.leftOnNeedles).toBe(castOn)
    },
  )

  it.each([
    // neck 48 sts at the top of the 144 (sheet (a)'s numbers), common practice per shape
    ['round', 24, 12],
    ['v', 0, 24],
    ['square', 48, 0],
  ] as const)('neck shape %s: centre cast-off %i, %i decreases at each neck edge (common practice)', (shape, centre, decreases) => {
    const piece = shapePiece({ ...frontSpec, neck: { width: 16, depth: 12, shape } }, g30x40)
    const right = piece.rows.filter(r => r.part === 'right')
    expect(right[0]!.castOff.centre).toBe(centre)
    expect(right.reduce((a, r) => a + r.decrease.left, 0)).toBe(decreases)
    expect(piece.counts.neck).toBe(48)
  })

  it('a V neck of an odd count casts off one stitch at the centre (common practice)', () => {
    // 147 cast on, 141 across the shoulders, 2 × 42 for the shoulders: 57 left for the neck
    const piece = shapePiece(
      {
        kind: 'body',
        hemWidth: 49,
        width: 49,
        lengthToUnderarm: 30,
        armhole: { castOff: 1, decrease: 0, depth: 18 },
        shoulder: { width: 14, drop: 0, method: 'cast-off' },
        neck: { width: 15, depth: 15, shape: 'v' },
      },
      g30x40,
    )
    expect(piece.castOn).toBe(147)
    expect(piece.counts.neckCentre).toBe(1)
    expect(piece.counts.neck % 2).toBe(1)
  })

  it('drop 0: each shoulder cast off straight on its part\'s last row (common practice)', () => {
    const piece = shapePiece({ ...frontSpec, shoulder: { width: 16, drop: 0, method: 'cast-off' } }, g30x40)
    const right = piece.rows.filter(r => r.part === 'right')
    expect(right.filter(r => r.castOff.right > 0).map(r => [r.row, r.castOff.right])).toEqual([[223, 48]])
  })

  it('shoulders by holding position: short rows towards the held needles, then one cast-off of the shoulder (common practice)', () => {
    const piece = shapePiece({ ...frontSpec, shoulder: { width: 16, drop: 1.5, method: 'hold' } }, g30x40)
    const right = piece.rows.filter(r => r.part === 'right')
    // 4 steps of 12: needles to holding position on the rows before the carriage-right rows 217, 219, 221
    expect(right.filter(r => r.row >= 214).map(r => [r.row, r.carriage, r.heldInPart, r.held, r.stitches, r.castOff.right])).toEqual([
      [214, 'left', 0, 60, 49, 0], [215, 'right', 0, 60, 48, 0], [216, 'left', 12, 72, 48, 0], [217, 'right', 12, 72, 48, 0],
      [218, 'left', 24, 84, 48, 0], [219, 'right', 24, 84, 48, 0], [220, 'left', 36, 96, 48, 0], [221, 'right', 36, 96, 48, 0],
      [222, 'left', 36, 96, 48, 0], [223, 'right', 0, 60, 0, 48],
    ])
    // The neck's last decrease moves below the first held row (row 216 holds).
    expect(right.filter(r => r.decrease.left > 0).at(-1)!.row).toBeLessThan(216)
  })

  it('a back (shoulders, no neck): the shoulders step on pairs of rows, the back neck goes on the last row (common practice)', () => {
    const piece = shapePiece({ ...frontSpec, neck: undefined }, g30x40)
    expect(piece.rows.every(r => r.part === 'whole')).toBe(true)
    expect(piece.rows).toHaveLength(224)
    expect(piece.rows.slice(216).map(r => [r.row, r.carriage, r.castOff.left, r.castOff.centre, r.castOff.right, r.stitches])).toEqual([
      [216, 'left', 12, 0, 0, 132], [217, 'right', 0, 0, 12, 120],
      [218, 'left', 12, 0, 0, 108], [219, 'right', 0, 0, 12, 96],
      [220, 'left', 12, 0, 0, 84], [221, 'right', 0, 0, 12, 72],
      [222, 'left', 12, 0, 0, 60], [223, 'right', 0, 48, 12, 0],
    ])
  })
})

// ---------------------------------------------------------------------------------------------
// Properties over random valid specs and gauges.

const other = (s: 'left' | 'right') => (s === 'left' ? 'right' : 'left')
const G = (gauge: { stitchesPer10cm: number; rowsPer10cm: number }) => ({
  ...gauge,
  stitchWidthMm: 100 / gauge.stitchesPer10cm,
  rowHeightMm: 100 / gauge.rowsPer10cm,
})

/** Every rule the outside holds the piece to, checked from the rows alone. */
function checkPiece(spec: ShapeSpec, gauge: { stitchesPer10cm: number; rowsPer10cm: number }, piece: ShapedPiece): void {
  // Plain comparisons (an expect per row would make the property runs slow); the message names the rule.
  const same = (got: unknown, want: unknown, rule: string) => {
    if (JSON.stringify(got) !== JSON.stringify(want)) throw new Error(`${rule}: got ${JSON.stringify(got)}, want ${JSON.stringify(want)}`)
  }
  const ok = (cond: boolean, rule: string) => { if (!cond) throw new Error(rule) }
  const near = (got: number, want: number, rule: string) => ok(Math.abs(got - want) <= 1, `${rule}: ${got} is not within 1 of ${want}`)
  const g = G(gauge)
  const rows = piece.rows
  same(piece.castOn, stitchesForWidth(spec.hemWidth, g), 'castOn = stitchesForWidth(hemWidth)')
  rows.forEach((r, i) => {
    for (const n of [
      r.stitches,
      r.held,
      r.heldInPart,
      r.castOff.left,
      r.castOff.right,
      r.castOff.centre,
      r.decrease.left,
      r.decrease.right,
      r.increase.left,
      r.increase.right,
    ]) {
      ok(Number.isInteger(n) && n >= 0, `row ${i}: a negative or broken count`)
    }
    // Carriage: row 0 from carriageStart, then alternating every row; edge cast-offs at its side.
    same(r.carriage, i === 0 ? spec.carriageStart ?? 'right' : other(rows[i - 1]!.carriage), `row ${i}: carriage`)
    if (r.castOff.left > 0) same(r.carriage, 'left', `row ${i}: a cast-off at the left`)
    if (r.castOff.right > 0) same(r.carriage, 'right', `row ${i}: a cast-off at the right`)
    // Holding position holds needles of the bed only.
    ok(r.heldInPart <= r.stitches, `row ${i}: more held than the part has`)
  })
  // Order: whole rows, then the right part, then the left part.
  const whole = rows.filter(r => r.part === 'whole')
  const right = rows.filter(r => r.part === 'right')
  const left = rows.filter(r => r.part === 'left')
  same(rows.map(r => r.part), [...whole, ...right, ...left].map(r => r.part), 'parts in order')
  // Conservation within each part; the neck split counts right.
  const change = (r: ShapedRow) =>
    -r.castOff.left - r.castOff.right - r.castOff.centre - r.decrease.left - r.decrease.right + r.increase.left + r.increase.right
  let prev = piece.castOn
  for (const r of whole) { same(r.stitches, prev + change(r), `row ${r.row}: conservation`); prev = r.stitches }
  if (right.length > 0) {
    const waiting = right[0]!.held - right[0]!.heldInPart
    right.forEach(r => same(r.held - r.heldInPart, waiting, `right row ${r.row}: the left side waits in holding position`))
    let p = prev - waiting
    for (const r of right) { same(r.stitches, p + change(r), `right row ${r.row}: conservation`); p = r.stitches }
    p = waiting
    for (const r of left) { same(r.stitches, p + change(r), `left row ${r.row}: conservation`); p = r.stitches }
    // Mirror: same rows, same shaping, left and right swapped; the centre only on the split row.
    same(left.length, right.length, 'mirror: row count')
    right.forEach((r, k) => {
      const l = left[k]!
      same([l.row, l.stitches, l.carriage], [r.row, r.stitches, other(r.carriage)], `mirror row ${r.row}`)
      same([l.castOff.left, l.castOff.right, l.decrease.left, l.decrease.right, l.increase.left, l.increase.right],
        [r.castOff.right, r.castOff.left, r.decrease.right, r.decrease.left, r.increase.right, r.increase.left], `mirror row ${r.row}: shaping`)
      ok(k === 0 || r.castOff.centre === 0, `right row ${r.row}: a centre cast-off after the split`)
      same(l.castOff.centre, 0, `left row ${l.row}: centre`)
      same(l.held, l.heldInPart, `left row ${l.row}: held`)
    })
    // The neck at the top is the rest: centre + both neck edges + both shoulders = the width at the split.
    const neckDecs = right.reduce((a, r) => a + r.decrease.left, 0)
    const shoulder = right.reduce((a, r) => a + r.castOff.right, 0)
    same(right[0]!.castOff.centre + 2 * neckDecs + 2 * shoulder, prev, 'neck + shoulders = across the shoulders')
    ok(right[0]!.castOff.centre + 2 * neckDecs >= stitchesForWidth(spec.neck!.width, g), 'the neck holds neck.width')
    if (spec.shoulder) near(shoulder, stitchesForWidth(spec.shoulder.width, g), 'each shoulder')
    same([right.at(-1)!.stitches, left.at(-1)!.stitches], [0, 0], 'each part cast off')
  }
  // Heights within a row of the measurements.
  const depth = spec.kind === 'body' ? spec.armhole?.depth ?? 0 : spec.cap?.height ?? 0
  near(whole.length + right.length, rowsForLength(spec.lengthToUnderarm + depth, g), 'rows of each part')
  const U = rowsForLength(spec.lengthToUnderarm, g)
  const underarmCastOff = stitchesForWidth((spec.kind === 'body' ? spec.armhole?.castOff : spec.cap?.castOff) ?? 0, g)
  if (underarmCastOff > 0) near(whole.findIndex(r => r.castOff.left + r.castOff.right > 0), U, 'rows to the underarm')
  // Side shaping: pairs on the rows the magic formula gives (bodies with an armhole, sleeves).
  if (spec.kind === 'sleeve' || spec.armhole) {
    const sideRows = whole.filter(r => r.row < U && r.increase.left + r.decrease.left + r.increase.right + r.decrease.right > 0)
    sideRows.forEach(r => same([r.increase.left, r.decrease.left], [r.increase.right, r.decrease.right], `row ${r.row}: side shaping in pairs`))
    if (sideRows.length > 0) {
      const at = sideRows.map(r => r.row + 1)
      const iv = at.map((a, i) => a - (i === 0 ? 0 : at[i - 1]!)).sort((a, b) => a - b)
      const want = spreadShaping(sideRows.length, U).flatMap(s => Array<number>(s.times).fill(s.every)).sort((a, b) => a - b)
      same(iv, want, 'side shaping spread by the magic formula')
    }
  }
  // A straight top stays on the needles; a shaped top ends at 0.
  const shaped = spec.kind === 'body' ? !!(spec.neck || spec.shoulder) : !!spec.cap
  same(piece.leftOnNeedles, shaped ? 0 : rows.at(-1)!.stitches, 'leftOnNeedles')
  if (shaped) same(rows.at(-1)!.stitches, 0, 'a shaped top is cast off')
  // A back's shoulders.
  if (spec.kind === 'body' && spec.shoulder && !spec.neck) {
    const armholeCastOff = stitchesForWidth(spec.armhole?.castOff ?? 0, g)
    near(whole.reduce((a, r) => a + r.castOff.right, 0) - armholeCastOff, stitchesForWidth(spec.shoulder.width, g), 'each shoulder of a back')
  }
}

describe('shapePiece — properties over random specs and gauges (common practice)', () => {
  it('keeps every declared rule: conservation, mirror, carriage side, targets within ±1, castOn, holding, no negative counts', () => {
    let valid = 0
    fc.assert(fc.property(specArb, gaugeArb, (spec, gauge) => {
      const piece = tryShape(spec, gauge)
      if (piece === null) return
      valid++
      checkPiece(spec, gauge, piece)
    }), { numRuns: 400 })
    // The generators must reach real pieces, not only refusals.
    expect(valid).toBeGreaterThan(100)
  })

  it('fronts with a neck: most generated ones are knitted and keep the rules', () => {
    const neckBody = bodyArb.map(s => ({
      ...s,
      armhole: s.armhole ?? { castOff: 2, decrease: 1, depth: 20 },
      neck: s.neck ?? { width: 14, depth: 7, shape: 'round' as const },
    }))
    let valid = 0
    fc.assert(fc.property(neckBody, gaugeArb, (spec, gauge) => {
      const piece = tryShape(spec, gauge)
      if (piece === null) return
      valid++
      expect(piece.rows.some(r => r.part === 'right')).toBe(true)
      checkPiece(spec, gauge, piece)
    }), { numRuns: 300 })
    expect(valid).toBeGreaterThan(60)
  })

  it('the held needles are the other side (while the right part is knitted) plus the part\'s own short rows, never more than the bed', () => {
    fc.assert(fc.property(bodyArb, gaugeArb, (spec, gauge) => {
      const piece = tryShape(spec, gauge)
      if (piece === null) return
      const right = piece.rows.filter(r => r.part === 'right')
      const left = piece.rows.filter(r => r.part === 'left')
      // While the right part is knitted the bed holds the right part and the waiting left side.
      const change = (r: ShapedRow) =>
        -r.castOff.left - r.castOff.right - r.castOff.centre - r.decrease.left - r.decrease.right + r.increase.left + r.increase.right
      const waiting = right.length > 0 ? left[0]!.stitches - change(left[0]!) : 0
      const bad = [
        ...right.filter(r => r.held - r.heldInPart !== waiting),
        ...left.filter(r => r.held !== r.heldInPart),
        ...piece.rows.filter(r => r.heldInPart > r.stitches),
      ]
      expect(bad).toEqual([])
    }), { numRuns: 200 })
  })
})

// ---------------------------------------------------------------------------------------------
// Refusals: each names the field to correct.

const back: ShapeSpec = { ...frontSpec, neck: undefined }

describe('shapePiece — bad specs throw a KnittingInputError naming the field', () => {
  it.each([
    ['a neck wider than the piece', 'neck.width', { ...frontSpec, neck: { width: 60, depth: 8, shape: 'round' } }],
    ['a neck of less than a stitch', 'neck.width', { ...frontSpec, neck: { width: 0.1, depth: 8, shape: 'round' } }],
    ['shoulders + neck wider than across the shoulders', 'shoulder.width', { ...frontSpec, shoulder: { width: 20, drop: 1.5, method: 'cast-off' } }],
    ['a back\'s shoulders wider than the piece', 'shoulder.width', { ...back, shoulder: { width: 30, drop: 1, method: 'hold' } }],
    ['round neck decreases that do not fit its depth', 'neck.depth', { ...frontSpec, neck: { width: 16, depth: 2, shape: 'round' } }],
    ['a neck starting inside the armhole shaping', 'neck.depth', { ...frontSpec, neck: { width: 16, depth: 19, shape: 'v' } }],
    ['a neck deeper than the piece', 'neck.depth', { ...frontSpec, neck: { width: 16, depth: 80, shape: 'square' } }],
    ['a shoulder drop deeper than the neck', 'shoulder.drop', { ...frontSpec, shoulder: { width: 16, drop: 10, method: 'cast-off' } }],
    ['more shoulder steps than stitches', 'shoulder.drop', { ...back, shoulder: { width: 1, drop: 3, method: 'cast-off' } }],
    [
      'armhole decreases that do not fit the depth',
      'armhole.decrease',
      { ...frontSpec, armhole: { castOff: 2, decrease: 10, depth: 10 }, neck: undefined, shoulder: undefined },
    ],
    ['armhole decreases eating the whole piece', 'armhole.decrease', { ...frontSpec, armhole: { castOff: 2, decrease: 30, depth: 20 } }],
    ['an armhole cast-off wider than the piece', 'armhole.castOff', { ...frontSpec, armhole: { castOff: 30, decrease: 0, depth: 20 } }],
    ['side shaping that does not fit the rows', 'width', { kind: 'body', hemWidth: 50, width: 20, lengthToUnderarm: 3 }],
    ['a cap too low for its decreases', 'cap.height', { ...sleeveSpec, cap: { castOff: 2, height: 2, topWidth: 8 } }],
    ['a cap of a row', 'cap.height', { ...sleeveSpec, cap: { castOff: 2, height: 0.25, topWidth: 8 } }],
    ['a cap top wider than the sleeve', 'cap.topWidth', { ...sleeveSpec, cap: { castOff: 2, height: 12, topWidth: 40 } }],
    ['a cap cast-off wider than the sleeve', 'cap.castOff', { ...sleeveSpec, cap: { castOff: 20, height: 12, topWidth: 8 } }],
    ['a sleeve with an armhole', 'armhole', { ...sleeveSpec, armhole: { castOff: 2, decrease: 1, depth: 20 } }],
    ['a sleeve with a neck', 'neck', { ...sleeveSpec, neck: { width: 16, depth: 8, shape: 'round' } }],
    ['a body with a cap', 'cap', { ...frontSpec, cap: { castOff: 2, height: 12, topWidth: 8 } }],
    ['an unknown kind', 'kind', { ...frontSpec, kind: 'scarf' } as unknown as ShapeSpec],
    ['an unknown carriage side', 'carriageStart', { ...frontSpec, carriageStart: 'middle' } as unknown as ShapeSpec],
    ['an unknown shoulder method', 'shoulder.method', { ...frontSpec, shoulder: { width: 16, drop: 1, method: 'fold' } } as unknown as ShapeSpec],
    ['an unknown neck shape', 'neck.shape', { ...frontSpec, neck: { width: 16, depth: 8, shape: 'boat' } } as unknown as ShapeSpec],
    ['no hem width', 'hemWidth', { ...frontSpec, hemWidth: 0 }],
    ['a hem of one stitch', 'hemWidth', { kind: 'body', hemWidth: 0.3, lengthToUnderarm: 10 }],
    ['a negative width', 'width', { ...frontSpec, width: -5 }],
    ['no length', 'lengthToUnderarm', { ...frontSpec, lengthToUnderarm: 0 }],
    ['a negative shoulder drop', 'shoulder.drop', { ...frontSpec, shoulder: { width: 16, drop: -1, method: 'hold' } }],
    ['no armhole depth', 'armhole.depth', { ...frontSpec, armhole: { castOff: 2, decrease: 1, depth: 0 } }],
    ['no neck depth', 'neck.depth', { ...frontSpec, neck: { width: 16, depth: 0, shape: 'v' } }],
  ] as [string, string, ShapeSpec][])('%s → %s (common practice)', (_name, field, spec) => {
    expect(inputError(() => shapePiece(spec, g30x40)).field).toBe(field)
  })

  it.each([
    [{ stitchesPer10cm: 0, rowsPer10cm: 40 }, 'gauge.stitchesPer10cm'],
    [{ stitchesPer10cm: 30, rowsPer10cm: Number.NaN }, 'gauge.rowsPer10cm'],
    [null, 'gauge'],
  ] as [{ stitchesPer10cm: number; rowsPer10cm: number }, string][])('gauge %j → %s', (gauge, field) => {
    expect(inputError(() => shapePiece(frontSpec, gauge)).field).toBe(field)
  })

  it('never throws anything but a KnittingInputError on random specs', () => {
    fc.assert(fc.property(specArb, gaugeArb, (spec, gauge) => { tryShape(spec, gauge) }), { numRuns: 300 })
  })
})
