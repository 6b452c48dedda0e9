import { writeFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import PlanSchematic from '~/components/plan/PlanSchematic.vue'
import { shapePiece } from '#shared/engine'
import { motifBands, pieceDimensions, pieceOutline } from '#shared/planner/schematic'
import { frontSpec, sleeveSpec } from '../support/shapeSpecs'

// The worked front and sleeve of tests/unit/engine/shapePiece.test.ts, drawn.
const g30x40 = { stitchesPer10cm: 30, rowsPer10cm: 40 }

function drawn(kind: 'body' | 'sleeve') {
  const piece = shapePiece(kind === 'body' ? frontSpec : sleeveSpec, g30x40)
  const outline = pieceOutline(piece, g30x40)
  return { outline, dimensions: pieceDimensions(piece, g30x40, kind) }
}

/** FLOATWISE_SCHEMATIC_OUT=/tmp/x writes the markup to x-<name>.html, to look at in a browser. */
function keep(name: string, html: string) {
  const out = process.env.FLOATWISE_SCHEMATIC_OUT
  if (out) writeFileSync(`${out}-${name}.html`, `<!doctype html><body style="margin:8px;background:#fff">${html}</body>`)
}

describe('PlanSchematic', () => {
  it('draws the worked front with its labels, to scale in cm', async () => {
    const { outline, dimensions } = drawn('body')
    const bands = motifBands(outline, [{ fromRow: 12, toRow: 60, label: 'Border motif' }, { fromRow: 130, toRow: 200, label: 'Yoke' }])
    const wrapper = await mountSuspended(PlanSchematic, {
      props: { outline, dimensions, bands, title: 'Front', labels: { hemWidth: '50 (54, 58) cm', width: '54 (58, 62) cm' } },
    })
    const svg = wrapper.get('[data-test="piece-schematic"]')
    const texts = Object.fromEntries(wrapper.findAll('[data-test="schematic-dimension"]').map(t => [t.attributes('data-key'), t.text()]))
    expect(texts).toEqual({
      hemWidth: '50 (54, 58) cm', width: '54 (58, 62) cm', lengthToUnderarm: '36 cm', armholeDepth: '20 cm', totalLength: '56 cm',
      neckDepth: '8.3 cm', neckWidth: '16 cm', shoulderWidth: '16 cm', acrossShoulders: '48 cm',
    })
    // The viewBox holds the 54 × 56 cm piece at 1 unit a cm, with room for the labels around it.
    const [x, y, w, h] = svg.attributes('viewBox')!.split(' ').map(Number) as [number, number, number, number]
    expect(outline.width).toBe(54)
    expect(outline.height).toBe(56)
    expect(x).toBeLessThan(0)
    expect(y).toBeLessThan(0)
    expect(x + w).toBeGreaterThan(54)
    expect(y + h).toBeGreaterThan(56)
    expect(w).toBeLessThan(54 * 1.6)
    expect(h).toBeLessThan(56 * 1.6)
    expect(svg.attributes('role')).toBe('img')
    expect(svg.attributes('aria-label')).toContain('Front, drawn to scale: hem width 50 (54, 58) cm, chest 54 (58, 62) cm')
    expect(svg.attributes('aria-label')).toContain('motif bands: Border motif, Yoke')
    expect(wrapper.findAll('[data-test="schematic-bands"] path')).toHaveLength(2)
    keep('front', wrapper.html())
  })

  it('gives its own values in inches, and a physical size when asked', async () => {
    const { outline, dimensions } = drawn('sleeve')
    const wrapper = await mountSuspended(PlanSchematic, {
      props: { outline, dimensions, bands: motifBands(outline, [{ fromRow: 150, toRow: 210, label: 'Band' }]), title: 'Sleeve', unit: 'in', scale: 0.2 },
    })
    const texts = Object.fromEntries(wrapper.findAll('[data-test="schematic-dimension"]').map(t => [t.attributes('data-key'), t.text()]))
    // To the nearest quarter inch: cuff 20 cm = 7.87 in (31.496 quarters) → 7¾; upper arm 32 cm = 12.60 → 12½;
    // 45 cm = 17.72 → 17¾; cap 12 cm = 4.72 → 4¾; 57 cm = 22.44 → 22½; top 8 cm = 3.15 → 3¼.
    expect(texts).toEqual({ hemWidth: '7¾ in', width: '12½ in', lengthToUnderarm: '17¾ in', capHeight: '4¾ in', totalLength: '22½ in', capTopWidth: '3¼ in' })
    const svg = wrapper.get('[data-test="piece-schematic"]')
    const w = Number(svg.attributes('viewBox')!.split(' ')[2])
    expect(svg.attributes('width')).toBe(`${w * 0.2}cm`)
    keep('sleeve', wrapper.html())
  })
})
