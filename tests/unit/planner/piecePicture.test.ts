import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { gaugePer10cm, needleColumns, chartFromRows } from '#shared/engine'
import { piecePicture, rowWidths } from '#shared/planner/piecePicture'
import { workPlanPiece } from '#shared/planner/planPiece'
import type { PieceTimeline } from '#shared/piece/types'

// The whole piece in its colours (model declared in shared/planner/piecePicture.ts).
const yarns = [{ slot: 'A', name: 'Oat', hex: '#e8dcc0', symbol: '●' }, { slot: 'B', name: 'Navy', hex: '#1c2a4a', symbol: '▲' }] as PieceTimeline['yarns']

/** The picture as text, top row (last knitted) first: '.' no stitch, otherwise the slot letter. */
function drawn(p: ReturnType<typeof piecePicture>): string[] {
  const lines: string[] = []
  for (let r = p.height - 1; r >= 0; r--) {
    let line = ''
    for (let i = 0; i < p.width; i++) { const c = p.cells[r * p.width + i]!; line += c ? p.slots[c - 1] : '.' }
    lines.push(line)
  }
  return lines
}

describe('piecePicture', () => {
  it('draws a worked example by hand: border, offset motif, then decreases', () => {
    const timeline: PieceTimeline = {
      technique: 'together', passesPerColour: 1, needles: 6, yarns,
      sections: [
        { kind: 'plain', label: 'Border', rows: 2, yarn: 'A' },
        // 3 stitches wide; offset 1: needle 0 knits column 1, needle 1 column 2, needle 2 column 0 …
        { kind: 'motif', label: 'M', motifName: 'M', chart: ['x..', '.x.'], chartRows: 3, main: 'A', contrast: 'B' },
        // one stitch each side on the 2nd and 4th row of the section
        { kind: 'plain', label: 'Decreases', rows: 4, yarn: 'B' },
      ],
    }
    const p = piecePicture(timeline, [0, 1, 0], [null, null, { change: 'decrease', steps: [{ every: 2, times: 2 }] }])
    expect(drawn(p)).toEqual([
      '..BB..', // 4th shaping row: the second decrease, 2 stitches left
      '.BBBB.',
      '.BBBB.', // 2nd shaping row: the first decrease
      'BBBBBB',
      'AABAAB', // chart row 0 again (3 chart rows of a 2-row chart)
      'BAABAA', // chart row 1 '.x.': column 1 is contrast → needles 0 and 3
      'AABAAB', // chart row 0 'x..': column 0 is contrast → needles 2 and 5
      'AAAAAA',
      'AAAAAA',
    ])
  })

  it('increases widen the picture symmetrically and carry the repeat outwards', () => {
    const timeline: PieceTimeline = {
      technique: 'together', passesPerColour: 1, needles: 4, yarns,
      sections: [
        { kind: 'plain', label: 'Increases', rows: 2, yarn: 'A' },
        { kind: 'motif', label: 'M', motifName: 'M', chart: ['x.'], chartRows: 1, main: 'A', contrast: 'B' },
      ],
    }
    const p = piecePicture(timeline, [0, 0], [{ change: 'increase', steps: [{ every: 1, times: 2 }] }, null])
    expect(drawn(p)).toEqual([
      'BABABABA', // needle −2 knits column 0 (x): the repeat continues past the cast-on edge
      'AAAAAAAA',
      '.AAAAAA.',
    ])
  })

  it('agrees with the engine: cast-on rows use needleColumns, the shaped width ends at the stitches workPlanPiece reports', () => {
    fc.assert(fc.property(
      fc.integer({ min: 8, max: 80 }), fc.integer({ min: 1, max: 7 }), fc.integer({ min: 1, max: 3 }),
      fc.integer({ min: 0, max: 12 }), fc.constantFrom('increase', 'decrease' as const),
      (widthCm, chartWidth, stitchesEachSide, offset, change) => {
        const chart = [Array.from({ length: chartWidth }, (_, i) => (i % 2 ? '.' : 'x')).join('')]
        const w = workPlanPiece(
          {
            name: 'P',
            copies: 1,
            targetWidth: widthCm,
            targetLength: 10,
            unit: 'cm',
            ease: 0,
            sections: [
              { kind: 'motif', motifId: 1, placement: { offset }, chartRows: 2, main: 'A', contrast: 'B' },
              { kind: 'shaping', change, stitchesEachSide, rows: 8 },
            ],
          },
          {
            gauge: gaugePer10cm({ stitchesPer10cm: 10, rowsPer10cm: 10 }),
            technique: 'together',
            passesPerColour: 2,
            floatLimit: 99,
            yarns,
            motifs: new Map([[1, { name: 'm', chart }]]),
          },
        )
        const p = piecePicture(w.timeline, w.offsets, w.shaping)
        const columns = needleColumns(chartWidth, w.needles, w.offsets[0])
        const left = (p.width - w.needles) / 2
        const parsed = chartFromRows(chart)
        for (let j = 0; j < w.needles; j++) {
          const expected = parsed.cells[columns[j]!] ? 2 : 1
          expect(p.cells[left + j]).toBe(expected)
        }
        expect(rowWidths(w.timeline, w.shaping).at(-1)).toBe(w.sections[1]!.shaping!.stitchesAfter)
      },
    ), { numRuns: 60 })
  })
})
