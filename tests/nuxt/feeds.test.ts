import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import type { VueWrapper } from '@vue/test-utils'
import FeedsCalculator from '~/components/feeds/FeedsCalculator.vue'

// Check values are hand calculations from the formulas of Machinery's Handbook (cutting speed,
// feeds for milling, MRR): n = 1000·Vc/(π·D), N = 12·V/(π·D), vf = fz·z·n, Q = ae·ap·vf.
// The screen shows whole rpm and four significant digits for the rest.
const result = (w: VueWrapper, key: string) => w.find(`[data-result="${key}"]`).text()
async function fill(w: VueWrapper, fields: Record<string, string>) {
  for (const [id, value] of Object.entries(fields)) await w.find(`#${id}`).setValue(value)
}
const choose = (w: VueWrapper, name: string, value: string) => w.find(`input[name="${name}"][value="${value}"]`).setValue(true)

describe('Feeds screen', () => {
  it.each([
    // Vc = 100 m/min, D = 10 mm → 3183.10 rpm (published by online spindle-speed calculators)
    ['10', '100', '3183 rpm'],
    // Vc = 120 m/min, D = 20 mm → 1909.86 rpm (published by online spindle-speed calculators)
    ['20', '120', '1910 rpm'],
  ])('metric: D %s mm at %s m/min turns at %s', async (diameter, speed, rpm) => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'mm' } })
    await fill(w, { 'feeds-diameter': diameter, 'feeds-surface': speed })
    expect(result(w, 'rpm')).toContain(rpm)
  })

  it('inch: 575 SFM on a 4 in diameter is 549 rpm (Machinery\'s Handbook Example 1; example wording from memory)', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'in' } })
    await fill(w, { 'feeds-diameter': '4', 'feeds-surface': '575' })
    expect(result(w, 'rpm')).toContain('549 rpm')
  })

  it('inch: 100 SFM on 0.5 in is 764 rpm, not the 800 of the 4·V/D shortcut (hand calculation)', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'in' } })
    await fill(w, { 'feeds-diameter': '0.5', 'feeds-surface': '100' })
    expect(result(w, 'rpm')).toContain('764 rpm')
  })

  it('back from rpm: 18000 rpm on 6.35 mm is 359.1 m/min, and 1178 SFM on 1/4 in (hand calculation)', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'mm' } })
    await choose(w, 'feeds-speed', 'rpm')
    await fill(w, { 'feeds-diameter': '6.35', 'feeds-rpm': '18000' })
    expect(result(w, 'surfaceSpeed')).toContain('359.1 m/min')
    // Changing units leaves the rpm unchanged and converts the diameter exactly (1 in = 25.4 mm).
    await choose(w, 'feeds-units', 'in')
    expect((w.find('#feeds-diameter').element as HTMLInputElement).value).toBe('0.25')
    expect(result(w, 'rpm')).toContain('18000 rpm')
    expect(result(w, 'surfaceSpeed')).toContain('1178 SFM')
  })

  it('feed from chip load: 0.004 in × 32 teeth × 88 rpm = 11.264 in/min (published as 11.2, New Concepts in Milling Handbook, 1973)', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'in' } })
    await choose(w, 'feeds-speed', 'rpm')
    await fill(w, { 'feeds-diameter': '4', 'feeds-flutes': '32', 'feeds-rpm': '88', 'feeds-chip': '0.004' })
    expect(result(w, 'feed')).toContain('11.26 in/min')
  })

  it('metric feed and back: 0.1 mm × 2 × 18000 rpm = 3600 mm/min, and 3600 mm/min gives 0.1 mm per tooth (hand calculation)', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'mm' } })
    await choose(w, 'feeds-speed', 'rpm')
    await fill(w, { 'feeds-diameter': '6', 'feeds-flutes': '2', 'feeds-rpm': '18000', 'feeds-chip': '0.1' })
    expect(result(w, 'feed')).toContain('3600 mm/min')
    await choose(w, 'feeds-feed', 'feed')
    await fill(w, { 'feeds-feed': '3600' })
    expect(result(w, 'chipLoad')).toContain('0.1 mm/tooth')
  })

  it('removal rate: 20 mm × 0.5 mm at 3000 mm/min = 30 cm³/min (MRR = F·W·t, hand calculation)', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'mm' } })
    await choose(w, 'feeds-speed', 'rpm')
    await choose(w, 'feeds-feed', 'feed')
    await fill(w, { 'feeds-diameter': '25', 'feeds-rpm': '18000', 'feeds-feed': '3000', 'feeds-width': '20', 'feeds-depth': '0.5' })
    expect(result(w, 'removalRate')).toContain('30 cm³/min')
  })

  it('names each bad field as it is typed, and keeps the speeds while the feed is incomplete', async () => {
    const w = await mountSuspended(FeedsCalculator, { props: { initialUnits: 'mm' } })
    await fill(w, { 'feeds-diameter': '0' })
    expect(w.find('#feeds-diameter-error').text()).toBe('Cutter diameter must be greater than zero.')
    await fill(w, { 'feeds-diameter': '10', 'feeds-flutes': '2.5', 'feeds-surface': '100' })
    expect(w.find('#feeds-diameter-error').exists()).toBe(false)
    expect(w.find('#feeds-flutes-error').text()).toBe('Flutes must be a whole number.')
    expect(w.find('#feeds-flutes').attributes('aria-invalid')).toBe('true')
    await fill(w, { 'feeds-flutes': '2', 'feeds-width': '6' })
    expect(w.find('#feeds-depth-error').text()).toBe('Removal rate needs both the width and the depth of cut.')
    expect(result(w, 'rpm')).toContain('3183 rpm')
    expect(result(w, 'feed')).toContain('Enter a chip load.')
    // The feed shows while the removal rate is still incomplete: 0.1 × 2 × 3183.10 = 636.6 mm/min.
    await fill(w, { 'feeds-chip': '0.1' })
    expect(result(w, 'feed')).toContain('636.6 mm/min')
    expect(result(w, 'removalRate')).toContain('Enter the width and depth of cut.')
  })
})
