import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { chartFromRows, compilePlan, nextChange } from '#shared/engine'
import type { PlanInput } from '#shared/engine'
import { inputError } from './helpers'

const chart3 = chartFromRows(['x..', '.x.', '..x'])

// Row counting (machine knitters' guides — common practice): together = one pass per
// chart row; colour by colour = passes per colour × 2 per chart row, main colour first.
describe('compilePlan', () => {
  it('together: plain border, one row per chart row with both yarns, plain border', () => {
    const out = compilePlan({
      technique: 'together',
      sections: [
        { kind: 'plain', rows: 2, yarn: 'navy' },
        { kind: 'motif', chart: chart3, chartRows: 4, main: 'navy', contrast: 'cream' },
        { kind: 'plain', rows: 1, yarn: 'navy' },
      ],
    })
    expect(out.rows.map(r => [r.section, r.yarns.join('+'), r.chartRow])).toEqual([
      [0, 'navy', null], [0, 'navy', null],
      [1, 'navy+cream', 0], [1, 'navy+cream', 1], [1, 'navy+cream', 2], [1, 'navy+cream', 0],
      [2, 'navy', null],
    ])
    expect(out.changes).toEqual([2, 6])
    expect(out.rows.map(r => r.rowInSection)).toEqual([0, 1, 0, 1, 2, 3, 0])
  })

  it('colour-by-colour: two passes per colour by default, main colour first, a change every two rows', () => {
    const out = compilePlan({
      technique: 'colour-by-colour',
      sections: [{ kind: 'motif', chart: chart3, chartRows: 2, main: 'M', contrast: 'C' }],
    })
    expect(out.rows.map(r => [r.yarns.join('+'), r.chartRow])).toEqual([
      ['M', 0], ['M', 0], ['C', 0], ['C', 0],
      ['M', 1], ['M', 1], ['C', 1], ['C', 1],
    ])
    expect(out.changes).toEqual([2, 4, 6])
  })

  it('colour-by-colour with passesPerColour 1 and 3', () => {
    const one = compilePlan({
      technique: 'colour-by-colour',
      passesPerColour: 1,
      sections: [{ kind: 'motif', chart: chart3, chartRows: 3, main: 'M', contrast: 'C' }],
    })
    expect(one.rows.map(r => r.yarns[0])).toEqual(['M', 'C', 'M', 'C', 'M', 'C'])
    expect(one.changes).toEqual([1, 2, 3, 4, 5])
    const three = compilePlan({
      technique: 'colour-by-colour',
      passesPerColour: 3,
      sections: [{ kind: 'motif', chart: chart3, chartRows: 1, main: 'M', contrast: 'C' }],
    })
    expect(three.rows.map(r => r.yarns[0]).join('')).toBe('MMMCCC')
  })

  it('plain border in the main colour before colour-by-colour: no change into the first main pass', () => {
    const out = compilePlan({
      technique: 'colour-by-colour',
      sections: [
        { kind: 'plain', rows: 3, yarn: 'M' },
        { kind: 'motif', chart: chart3, chartRows: 1, main: 'M', contrast: 'C' },
        { kind: 'plain', rows: 2, yarn: 'C' },
      ],
    })
    expect(out.rows.map(r => r.yarns[0]).join('')).toBe('MMMMMCCCC')
    expect(out.changes).toEqual([5])
  })

  it('passesPerColour is ignored for together', () => {
    const out = compilePlan({ technique: 'together', passesPerColour: 2, sections: [{ kind: 'motif', chart: chart3, chartRows: 3, main: 'M', contrast: 'C' }] })
    expect(out.rows).toHaveLength(3)
  })

  it('swapping main and contrast between two motif sections is a change', () => {
    const out = compilePlan({
      technique: 'together',
      sections: [
        { kind: 'motif', chart: chart3, chartRows: 1, main: 'A', contrast: 'B' },
        { kind: 'motif', chart: chart3, chartRows: 1, main: 'B', contrast: 'A' },
      ],
    })
    expect(out.changes).toEqual([1])
  })

  it('an empty plan compiles to an empty timeline', () => {
    expect(compilePlan({ technique: 'together', sections: [] })).toEqual({ rows: [], changes: [] })
  })

  it('row count, chart row cycle and changes are consistent (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('together', 'colour-by-colour' as const),
        fc.integer({ min: 1, max: 4 }),
        fc.array(
          fc.oneof(
            fc.record({ kind: fc.constant('plain' as const), rows: fc.integer({ min: 1, max: 6 }), yarn: fc.constantFrom('A', 'B', 'C') }),
            fc.record({
              kind: fc.constant('motif' as const),
              chartRows: fc.integer({ min: 1, max: 8 }),
              pair: fc.constantFrom(['A', 'B'], ['B', 'A'], ['A', 'C']),
            }),
          ),
          { maxLength: 5 },
        ),
        (technique, passes, raw) => {
          const plan: PlanInput = {
            technique,
            passesPerColour: passes,
            sections: raw.map(s => (s.kind === 'plain' ? s : { kind: 'motif', chart: chart3, chartRows: s.chartRows, main: s.pair[0]!, contrast: s.pair[1]! })),
          }
          const out = compilePlan(plan)
          const per = technique === 'together' ? 1 : 2 * passes
          const want = raw.reduce((a, s) => a + (s.kind === 'plain' ? s.rows : s.chartRows * per), 0)
          expect(out.rows).toHaveLength(want)
          out.rows.forEach((r, i) => {
            if (r.chartRow !== null) expect(r.chartRow).toBe(Math.floor(r.rowInSection / per) % 3)
            if (i > 0) expect(out.changes.includes(i)).toBe(r.yarns.join('|') !== out.rows[i - 1]!.yarns.join('|'))
          })
        },
      ),
    )
  })

  it.each([
    [{ technique: 'both', sections: [] }, 'plan.technique: expected "together" or "colour-by-colour", got "both"'],
    [{ technique: 'colour-by-colour', passesPerColour: 0, sections: [] }, 'plan.passesPerColour: must be at least 1, got 0'],
    [{ technique: 'together', sections: 'x' }, 'plan.sections: expected a list of sections'],
    [{ technique: 'together', sections: [{ kind: 'rib', rows: 3 }] }, 'plan.sections[0].kind: expected "plain" or "motif", got "rib"'],
    [{ technique: 'together', sections: [{ kind: 'plain', rows: 0, yarn: 'A' }] }, 'plan.sections[0].rows: must be at least 1, got 0'],
    [{ technique: 'together', sections: [{ kind: 'plain', rows: 2, yarn: '' }] }, 'plan.sections[0].yarn: expected a yarn name, got ""'],
    [
      {
        technique: 'together',
        sections: [
          { kind: 'plain', rows: 2, yarn: 'A' },
          { kind: 'motif', chart: chart3, chartRows: 2.5, main: 'A', contrast: 'B' },
        ],
      },
      'plan.sections[1].chartRows: expected a whole number, got 2.5',
    ],
    [
      {
        technique: 'together',
        sections: [{ kind: 'motif', chart: { width: 2, height: 1, cells: new Uint8Array(1) }, chartRows: 2, main: 'A', contrast: 'B' }],
      },
      'plan.sections[0].chart: 1 cells, expected 2 (2 × 1)',
    ],
    [
      { technique: 'together', sections: [{ kind: 'motif', chart: chart3, chartRows: 2, main: 'A', contrast: 'A' }] },
      'plan.sections[0]: main and contrast are the same yarn "A"',
    ],
    [
      { technique: 'together', sections: [{ kind: 'motif', chart: chart3, chartRows: 2, main: 'A' }] },
      'plan.sections[0].contrast: expected a yarn name, got undefined',
    ],
  ])('rejects %o', (plan, message) => {
    const e = inputError(() => compilePlan(plan as unknown as PlanInput))
    expect(e.message).toBe(message)
    expect(e.field).toBeDefined()
  })
})

describe('nextChange', () => {
  it.each([[0, 2], [2, 2], [3, 6], [6, 6], [7, null]])('from row %i → %s', (row, want) => {
    expect(nextChange([2, 6], row)).toBe(want)
  })
})
