import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import UiChoice from '~/components/ui/UiChoice.vue'
import UiField from '~/components/ui/UiField.vue'

// The one field and the one choice every form is built from (issue 13): what a screen reader
// and a gloved finger get from each.
describe('UiField', () => {
  it('ties the label, the unit, the hint and the reason to the control', async () => {
    const wrapper = await mountSuspended(UiField, { props: { id: 'f-depth', label: 'Depth', unit: 'mm', hint: 'From the top of the board.', error: 'Enter a number.', modelValue: '' } })
    const input = wrapper.get('input')
    expect(wrapper.get('label').attributes('for')).toBe('f-depth')
    expect(wrapper.get('label').text()).toBe('Depth (mm)')
    expect(input.attributes('aria-invalid')).toBe('true')
    expect(input.attributes('aria-describedby')).toBe('f-depth-hint f-depth-error')
    expect(wrapper.get('#f-depth-error').text()).toBe('Enter a number.')
    expect(wrapper.get('#f-depth-hint').text()).toBe('From the top of the board.')
  })

  it('opens the right keypad and reports what was typed', async () => {
    const wrapper = await mountSuspended(UiField, { props: { 'id': 'f-rpm', 'label': 'Speed', 'numeric': 'whole' as const, 'modelValue': '', 'onUpdate:modelValue': (v: string) => wrapper.setProps({ modelValue: v }) } })
    const input = wrapper.get('input')
    expect(input.attributes('inputmode')).toBe('numeric')
    expect(input.attributes('aria-invalid')).toBeUndefined()
    await input.setValue('18000')
    expect(wrapper.props('modelValue')).toBe('18000')
    expect(wrapper.emitted('touched')).toBeTruthy()
  })

  it('writes in a textarea when asked, and lends its id to a control of the caller', async () => {
    const long = await mountSuspended(UiField, { props: { id: 'f-why', label: 'Why', multiline: true, rows: 2, modelValue: 'dust' } })
    expect(long.get('textarea').element.value).toBe('dust')
    const Picked = defineComponent(() => () => h(UiField, { id: 'f-kind', label: 'Kind', error: 'Pick one.' }, {
      default: ({ id, describedBy, invalid }: { id: string, describedBy?: string, invalid?: string }) =>
        h('select', { 'id': id, 'aria-describedby': describedBy, 'aria-invalid': invalid }, [h('option', 'A')]),
    }))
    const wrapper = await mountSuspended(Picked)
    const select = wrapper.get('select')
    expect(select.attributes('id')).toBe('f-kind')
    expect(select.attributes('aria-describedby')).toBe('f-kind-error')
    expect(select.attributes('aria-invalid')).toBe('true')
    expect(wrapper.findAll('input')).toHaveLength(0)
  })
})

describe('UiChoice', () => {
  it('is a group of real radios named by its legend, and changes the model', async () => {
    const chosen = ref<'mm' | 'in'>('mm')
    const Units = defineComponent(() => () => h(UiChoice<'mm' | 'in'>, {
      'legend': 'Units', 'name': 'units', 'options': [{ value: 'mm', label: 'Millimetres' }, { value: 'in', label: 'Inches' }],
      'modelValue': chosen.value, 'onUpdate:modelValue': (v: 'mm' | 'in') => { chosen.value = v },
    }))
    const wrapper = await mountSuspended(Units)
    expect(wrapper.get('legend').text()).toBe('Units')
    const radios = wrapper.findAll('input[type=radio]')
    expect(radios).toHaveLength(2)
    expect((radios[0]!.element as HTMLInputElement).checked).toBe(true)
    await radios[1]!.setValue(true)
    expect(chosen.value).toBe('in')
  })

  it('starts with nothing chosen and keeps the legend for screen readers only when asked', async () => {
    const wrapper = await mountSuspended(UiChoice, { props: { legend: 'Who signs', name: 'signer', hideLegend: true, options: [{ value: 2, label: 'A trainer' }], modelValue: null } })
    expect(wrapper.get('legend').classes()).toContain('sr-only')
    expect((wrapper.get('input').element as HTMLInputElement).checked).toBe(false)
  })
})
