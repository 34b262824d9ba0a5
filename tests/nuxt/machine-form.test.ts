import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import MachineForm from '~/components/machine/MachineForm.vue'

describe('MachineForm', () => {
  it('shows each field\'s reason beside the field and does not submit', async () => {
    const wrapper = await mountSuspended(MachineForm, { props: { submitLabel: 'Add machine' } })
    await wrapper.find('form').trigger('submit')
    expect(wrapper.emitted('submit')).toBeUndefined()
    expect(wrapper.text()).toContain('Enter a name.')
    expect(wrapper.text()).toContain('X travel must be a number.')
  })

  it('converts inches to millimetres exactly (1 in = 25.4 mm, NBS Circular 572 addendum)', async () => {
    const wrapper = await mountSuspended(MachineForm, { props: { submitLabel: 'Add machine' } })
    await wrapper.find('#m-name').setValue('Test Router')
    await wrapper.findAll('input[type=radio]')[1]!.setValue(true)
    const lengths: Record<string, string> = { travelXMm: '24', travelYMm: '24', travelZMm: '4', spoilboardNominalMm: '0.75', spoilboardMinMm: '0.5' }
    for (const [k, v] of Object.entries(lengths)) await wrapper.find(`#m-${k}`).setValue(v)
    await wrapper.find('form').trigger('submit')
    const [value] = wrapper.emitted('submit')![0]!
    expect(value.travelXMm).toBeCloseTo(609.6, 10)
    expect(value.spoilboardNominalMm).toBeCloseTo(19.05, 10)
    expect(value.units).toBe('in')
  })

  it('refuses a minimum thickness at or above the nominal one', async () => {
    const wrapper = await mountSuspended(MachineForm, { props: { submitLabel: 'Save', initial: { name: 'A', units: 'mm', travelXMm: 600, travelYMm: 600, travelZMm: 90, spoilboardNominalMm: 18, spoilboardMinMm: 18 } } })
    await wrapper.find('form').trigger('submit')
    expect(wrapper.text()).toContain('The minimum thickness must be less than the nominal thickness.')
  })
})
