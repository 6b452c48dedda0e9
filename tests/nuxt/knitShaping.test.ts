import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { shapedNeedles, shapePiece } from '#shared/engine'
import { shapeStep } from '#shared/piece/shapeSteps'
import type { TimelineShape } from '#shared/piece/types'
import KnitShaping from '~/components/knit/KnitShaping.vue'
import { frontSpec } from '../support/shapeSpecs'

// The worked front of tests/unit/engine/shapePiece.test.ts, as the knit view shows its steps.
const piece = shapePiece(frontSpec, { stitchesPer10cm: 30, rowsPer10cm: 40 })
const shape: TimelineShape = { size: 'M', kind: 'body', castOn: piece.castOn, rows: piece.rows, leftOnNeedles: piece.leftOnNeedles }
const needles = shapedNeedles(piece)
const mount = (rowIndex: number) => mountSuspended(KnitShaping, { props: { step: shapeStep(shape, needles, rowIndex) } })
const nowTexts = (w: Awaited<ReturnType<typeof mount>>) => w.findAll('[data-test="shaping-now"] [data-test="shaping-text"]').map(t => t.text())
const text = (w: Awaited<ReturnType<typeof mount>>, test: string) => w.get(`[data-test="${test}"]`).text().replace(/\s+/g, ' ').trim()

describe('KnitShaping', () => {
  it('the first neck row: what to do now, the part, the needles, the carriage', async () => {
    const w = await mount(191)
    expect(w.find('[data-test="knit-shaping"]').exists()).toBe(true)
    expect(nowTexts(w)).toEqual([
      'Cast off the centre 24 stitches',
      'Push the right 60 needles to holding position',
    ])
    expect(text(w, 'shaping-note')).toBe('Set the carriage to pass over needles in holding position.')
    // A side gets an arrow pointing to it (the words say it too).
    expect(w.findAll('[data-test="shaping-now"] li').map(li => [li.attributes('data-side'), li.find('[aria-hidden="true"]').exists()]))
      .toEqual([['centre', false], ['right', true]])
    expect(text(w, 'shaping-part')).toBe('Left side of neck · 1 of 33 rows')
    expect(text(w, 'needles-in-work')).toBe('60 needles in work · 60 in holding position')
    expect(text(w, 'carriage-side')).toBe('Carriage at the left; after this row at the right')
    expect(w.find('[data-test="shaping-next"]').exists()).toBe(false) // row index 192 has no shaping
    w.unmount()
  })

  it('one row ahead: the first shoulder step comes on the row after the last neck decrease', async () => {
    const before = await mount(216)
    expect(nowTexts(before)).toEqual(['Decrease 1 at the right (neck edge)'])
    expect(text(before, 'shaping-next')).toBe('Next row: Cast off 12 at the left (carriage side)')
    expect(text(before, 'shaping-part')).toBe('Left side of neck · 26 of 33 rows')
    before.unmount()
  })

  it('the last row of the piece: the last shoulder step, nothing after it', async () => {
    const w = await mount(256)
    expect(nowTexts(w)).toEqual(['Cast off the last 12 stitches of the shoulder at the right (carriage side)'])
    expect(text(w, 'needles-in-work')).toBe('0 needles in work')
    expect(w.find('[data-test="shaping-next"]').exists()).toBe(false)
    w.unmount()
  })

  it('a row without shaping says so, and shows no part below the neck', async () => {
    const w = await mount(10)
    expect(text(w, 'shaping-now')).toBe('No shaping: knit the row.')
    expect(w.find('[data-test="shaping-part"]').exists()).toBe(false)
    expect(w.find('[data-test="shaping-next"]').exists()).toBe(false)
    expect(text(w, 'needles-in-work')).toBe('150 needles in work')
    w.unmount()
  })

  it('the second part begins: held needles back, the yarn joined where the carriage is', async () => {
    const w = await mount(224)
    expect(w.findAll('[data-test="shaping-now"] li').map(li => li.attributes('data-kind'))).toEqual(['return', 'join'])
    expect(nowTexts(w)).toEqual(['Now the right side: bring the 60 held needles back to work', 'Join the yarn at the right edge, where the carriage is'])
    expect(text(w, 'shaping-part')).toBe('Right side of neck · 1 of 33 rows')
    expect(text(w, 'needles-in-work')).toBe('60 needles in work')
    expect(w.get('[data-test="carriage-side"]').attributes('data-before')).toBe('right')
    w.unmount()
  })

  it('a straight top: after the last row, what to do with the stitches; then the piece knitted', async () => {
    const rect = shapePiece({ kind: 'body', hemWidth: 40, lengthToUnderarm: 30 }, { stitchesPer10cm: 30, rowsPer10cm: 40 })
    const flat: TimelineShape = { size: 'M', kind: 'body', castOn: rect.castOn, rows: rect.rows, leftOnNeedles: rect.leftOnNeedles }
    const last = await mountSuspended(KnitShaping, { props: { step: shapeStep(flat, shapedNeedles(rect), rect.rows.length - 1) } })
    expect(text(last, 'shaping-next')).toBe('After this row: Take the 120 stitches off on waste yarn, or cast them off')
    last.unmount()
    const done = await mountSuspended(KnitShaping, { props: { step: shapeStep(flat, shapedNeedles(rect), rect.rows.length) } })
    expect(text(done, 'knit-shaping')).toContain('Piece knitted')
    expect(text(done, 'needles-in-work')).toBe('120 needles in work')
    expect(text(done, 'carriage-side')).toBe(`Carriage at the ${rect.rows.length % 2 === 0 ? 'left' : 'right'}`)
    done.unmount()
  })
})
