import { describe, expect, it } from 'vitest'
import { defineComponent, h, nextTick, ref } from 'vue'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import PlanShapeEditor from '~/components/plan/PlanShapeEditor.vue'
import PlanSizesEditor from '~/components/plan/PlanSizesEditor.vue'
import type { PieceShape } from '#shared/types/plan'

// The sizes and the shape table of a plan piece: fill a row by a step, see the grading checks,
// and the sizes' changes carried to the numbers.
const sizes = ['S', 'M', 'L', 'XL']
const shape = (): PieceShape => ({
  kind: 'body', carriageStart: 'right', armhole: false, shoulder: null, neck: 'round', cap: false,
  measurements: { hemWidth: [43, 48, 53, 58], lengthToUnderarm: [38, 40, 42, 44], neckWidth: [15, 16, 15, 17], neckDepth: [7, 7, 8, 8] },
  ease: {},
})

async function mountShape(start: PieceShape | null) {
  const model = ref<PieceShape | null>(start)
  const wrapper = await mountSuspended(defineComponent({
    setup: () => () => h(PlanShapeEditor, { 'shape': model.value, sizes, 'unit': 'cm', 'onUpdate:shape': (s: PieceShape | null) => { model.value = s } }),
  }))
  return { wrapper, model }
}
const valuesOf = (row: { findAll: (s: string) => { element: Element }[] }) => row.findAll('[data-test="shape-value"]').map(i => (i.element as HTMLInputElement).value)

describe('PlanShapeEditor', () => {
  it('fills a row by a step from the first size and shows the numbers', async () => {
    const { wrapper, model } = await mountShape(shape())
    const row = wrapper.get('[data-test="shape-measurement-width"]')
    expect(valuesOf(row)).toEqual(['', '', '', ''])
    await row.get('[data-test="shape-fill-step"]').trigger('click')
    await wrapper.get('[data-test="shape-fill-first"]').setValue('45.5')
    await wrapper.get('[data-test="shape-fill-by"]').setValue('2.5')
    await wrapper.get('[data-test="shape-fill"]').trigger('submit')
    expect(model.value?.measurements.width).toEqual([45.5, 48, 50.5, 53])
    expect(valuesOf(wrapper.get('[data-test="shape-measurement-width"]'))).toEqual(['45.5', '48', '50.5', '53'])
  })

  it('shows a grading problem beside its row, and it goes once the number is put right', async () => {
    const { wrapper, model } = await mountShape(shape())
    const row = () => wrapper.get('[data-test="shape-measurement-neckWidth"]')
    expect(row().get('[data-test="shape-problem"]').text()).toBe('Neck width gets smaller from M to L (16 → 15)')
    expect(wrapper.findAll('[data-test="shape-problem"]')).toHaveLength(1)
    const third = row().findAll('[data-test="shape-value"]')[2]!
    await third.setValue('16.5')
    await third.trigger('change')
    expect(model.value?.measurements.neckWidth).toEqual([15, 16, 16.5, 17])
    expect(wrapper.findAll('[data-test="shape-problem"]')).toHaveLength(0)
  })

  it('adds and drops rows with the choices, and a rectangle is no shape', async () => {
    const { wrapper, model } = await mountShape(null)
    await wrapper.get('[data-test="shape-kind"]').setValue('body')
    expect(Object.keys(model.value!.measurements)).toEqual(['hemWidth', 'lengthToUnderarm'])
    expect(model.value!.measurements.hemWidth).toHaveLength(4)
    await wrapper.get('[data-test="shape-armhole"]').setValue(true)
    expect(Object.keys(model.value!.measurements)).toEqual(['hemWidth', 'lengthToUnderarm', 'armholeCastOff', 'armholeDecrease', 'armholeDepth'])
    expect(wrapper.find('[data-test="shape-measurement-armholeDepth"]').exists()).toBe(true)
    await wrapper.get('[data-test="shape-kind"]').setValue('sleeve')
    expect(model.value).toMatchObject({ kind: 'sleeve', armhole: false })
    expect(Object.keys(model.value!.measurements)).toEqual(['hemWidth', 'lengthToUnderarm'])
    expect(wrapper.get('[data-test="shape-measurement-width"] th').text()).toContain('Width at the upper arm')
    await wrapper.get('[data-test="shape-kind"]').setValue('rectangle')
    expect(model.value).toBeNull()
    expect(wrapper.find('[data-test="shape-table"]').exists()).toBe(false)
  })
})

describe('PlanSizesEditor', () => {
  it('adds, moves, removes and types sizes, saying where each size\'s numbers come from', async () => {
    const model = ref(['S', 'M'])
    const remaps: (number | null)[][] = []
    const wrapper = await mountSuspended(defineComponent({
      setup: () => () => h(PlanSizesEditor, {
        'modelValue': model.value, 'onUpdate:modelValue': (v: string[]) => { model.value = v }, 'onRemap': (m: (number | null)[]) => remaps.push(m),
      }),
    }))
    await wrapper.get('[data-test="plan-size-add"]').trigger('click')
    expect(model.value).toEqual(['S', 'M', 'Size 3'])
    await wrapper.findAll('[data-test="plan-size-name"]')[2]!.setValue('L')
    expect(model.value).toEqual(['S', 'M', 'L'])
    await wrapper.get('[aria-label="Move L smaller"]').trigger('click')
    expect(model.value).toEqual(['S', 'L', 'M'])
    await wrapper.get('[aria-label="Remove S"]').trigger('click')
    await wrapper.get('[data-test="plan-size-range"]').setValue('xs, m, l, xl')
    await wrapper.get('form').trigger('submit')
    await nextTick()
    expect(model.value).toEqual(['xs', 'm', 'l', 'xl'])
    expect(remaps).toEqual([[0, 1, null], [0, 2, 1], [1, 2], [null, 1, 0, null]])
    expect(wrapper.findAll('[data-test="plan-size-name"]').map(i => (i.element as HTMLInputElement).value)).toEqual(['xs', 'm', 'l', 'xl'])
  })
})
