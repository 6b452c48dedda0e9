import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import MotifCardSheets from '~/components/motif/MotifCardSheets.vue'
import { cardAsPunched, chartFromRows, punchCard } from '#shared/engine'

// The card drawing from a small chart, as the punch-card page builds it.
function drawn(rows: string[], width: number, minRows: number, joinRows = 0) {
  const card = punchCard(chartFromRows(rows), { width, minRows, joinRows })
  return mountSuspended(MotifCardSheets, {
    props: { card: cardAsPunched(card), loopRows: card.rows - joinRows, holePitchMm: 4.5, rowPitchMm: 5, paper: 'A4', title: 'Test' },
  })
}

describe('MotifCardSheets', () => {
  it('draws one circle a punched hole, in mm at full size', async () => {
    // 'x..x' / '.xx.' on a 12-wide card: 2 holes a row in each of 3 repeats, 4 loop rows and 2 join rows.
    const wrapper = await drawn(['x..x', '.xx.'], 12, 4, 2)
    expect(wrapper.findAll('[data-test="card-hole"]')).toHaveLength(6 * 4 + 6 * 2)
    const svg = wrapper.get('[data-test="card-svg"]')
    const [, , w, h] = svg.attributes('viewBox')!.split(' ').map(Number)
    expect(svg.attributes('width')).toBe(`${w}mm`)
    expect(svg.attributes('height')).toBe(`${h}mm`)
    expect(wrapper.findAll('[data-test="card-join-row"]')).toHaveLength(2)
    expect(wrapper.find('[data-test="card-ruler"]').attributes('width')).toBe('108mm')
    expect(wrapper.text()).toContain('sheet 1 of 1')
    expect(wrapper.text()).toContain('At the machine')
  })

  it('prints the card mirrored: chart column 0 is the right edge of the card', async () => {
    const wrapper = await drawn(['x...'], 4, 1)
    const holes = wrapper.findAll('[data-test="card-hole"]')
    expect(holes).toHaveLength(1)
    expect(holes[0]!.attributes('data-col')).toBe('3')
    const dots = wrapper.findAll('circle').filter(c => c.attributes('data-test') !== 'card-hole')
    expect(Math.max(...dots.map(d => Number(d.attributes('cx'))))).toBeLessThan(Number(holes[0]!.attributes('cx')))
  })

  it('splits a long card over sheets', async () => {
    const wrapper = await drawn(['x.', '.x'], 24, 80)
    const sheets = wrapper.findAll('[data-test="card-sheet"]')
    expect(sheets).toHaveLength(3)
    expect(sheets[1]!.text()).toContain('sheet 2 of 3')
    expect(sheets[1]!.text()).toContain('Rows 38–74 of 80')
    expect(wrapper.findAll('[data-test="card-hole"]')).toHaveLength(80 * 12)
    expect(sheets[1]!.findAll('[data-test="card-join-mark"]')).toHaveLength(2)
  })
})
