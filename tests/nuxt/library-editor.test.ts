import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import type { DOMWrapper, VueWrapper } from '@vue/test-utils'
import { ProcedureSchema, SUPPLEMENT_NOTICE } from '#shared/procedures'
import type { ProcedureStepInput } from '#shared/procedures'
import LibraryProcedureEditor from '~/components/library/LibraryProcedureEditor.vue'
import HoldPanel from '~/components/library/HoldPanel.vue'

const signoff: ProcedureStepInput = { key: 'final-signoff', kind: 'signoff', title: 'Sign off the run', body: 'Sign only when every part is true.', statement: 'The board was faced flat over its whole area.' }
const steps: ProcedureStepInput[] = [
  { key: 'clear-bed', kind: 'instruction', title: 'Clear the bed', body: 'Take every clamp and fence off the bed.' },
  { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off at the isolator.', signalWord: 'WARNING', hazard: 'Unplugging a live cable can give a shock.', avoid: 'Switch off and lock the isolator first.', needsTrainerSignoff: true },
  { key: 'depth', kind: 'check', title: 'Measure the depth', body: 'Measure the cut depth.', label: 'Depth of cut', unit: 'mm', min: 0.1, max: 0.5 },
  signoff,
]
const initial = { title: 'Resurface the board', summary: 'Face the spoilboard flat to the cutter.', category: 'surfacing' as const, steps }

const mountEditor = (props: Record<string, unknown> = {}) =>
  mountSuspended(LibraryProcedureEditor, { props: { submitLabel: 'Publish', initial, ...props } })

/** The message a field points at through aria-describedby, i.e. the error shown beside it. */
function errorBeside(wrapper: { find(selector: string): DOMWrapper<Element> }, selector: string) {
  const input = wrapper.find(selector)
  expect(input.exists(), `no field ${selector}`).toBe(true)
  expect(input.attributes('aria-invalid')).toBe('true')
  const ids = (input.attributes('aria-describedby') ?? '').split(' ').filter(id => id.endsWith('-error'))
  expect(ids).toHaveLength(1)
  return wrapper.find(`#${ids[0]}`).text()
}
const legends = (wrapper: VueWrapper) => wrapper.findAll('ol[aria-label="Steps"] legend').map(l => l.text()).filter(t => t.startsWith('Step '))
const emittedBody = (wrapper: VueWrapper) => (wrapper.emitted('submit')?.at(-1) as [{ procedure: any, changeNote?: string }] | undefined)?.[0]

describe('LibraryProcedureEditor', () => {
  it('shows each schema message beside its own field and does not submit', async () => {
    const wrapper = await mountEditor({
      initial: {
        ...initial,
        title: 'Re',
        steps: [
          signoff,
          { ...steps[1]!, hazard: 'Shock.' },
          { ...steps[2]!, min: 0.5, max: 0.1 },
          { ...steps[0]!, key: 'Clear Bed' },
        ],
      },
    })
    await wrapper.find('form').trigger('submit')
    expect(wrapper.emitted('submit')).toBeUndefined()
    // Messages are the shared schema's, so the form and the API say the same thing.
    expect(errorBeside(wrapper, '#p-title')).toBe('Procedure title needs at least 3 characters.')
    const [first, hold, check, last] = wrapper.findAll('[data-step-uid]')
    expect(errorBeside(first!, 'select[id$="-kind"]')).toBe('A sign-off step must be the last step.')
    expect(errorBeside(hold!, '[id$="-hazard"]')).toBe('Hazard statement needs at least 10 characters.')
    expect(errorBeside(check!, '[id$="-max"]')).toBe('Highest allowed value must not be less than the lowest allowed value.')
    expect(errorBeside(last!, '[id$="-key"]')).toContain('Step key may use only lower-case letters')
    expect(wrapper.text()).toContain('The last step must be a sign-off step')
    // Fixing a field clears its message at once; the others stay.
    await wrapper.find('#p-title').setValue('Resurface the board')
    expect(wrapper.find('#p-title').attributes('aria-invalid')).toBeUndefined()
    expect(hold!.find('[id$="-hazard"]').attributes('aria-invalid')).toBe('true')
  })

  it('shows the server\'s issues beside the same fields, without the request\'s "procedure." prefix', async () => {
    const wrapper = await mountEditor({ serverIssues: [
      { path: 'procedure.steps.1.avoid', message: 'How to avoid the hazard: sentence 1 has 31 words.' },
      { path: 'changeNote', message: 'Keep the change note under 500 characters.' },
    ] })
    const hold = wrapper.findAll('[data-step-uid]')[1]!
    expect(errorBeside(hold, '[id$="-avoid"]')).toBe('How to avoid the hazard: sentence 1 has 31 words.')
    expect(errorBeside(wrapper, '#p-note')).toBe('Keep the change note under 500 characters.')
  })

  it('moves a step up and down with the buttons, and the published order follows', async () => {
    const wrapper = await mountEditor()
    expect(legends(wrapper)).toEqual(['Step 1 · Instruction', 'Step 2 · Hold point', 'Step 3 · Measured check', 'Step 4 · Sign-off'])
    expect(wrapper.find('[aria-label="Move step 1 up"]').attributes('disabled')).toBeDefined()
    await wrapper.find('[aria-label="Move step 3 up"]').trigger('click')
    expect(legends(wrapper)).toEqual(['Step 1 · Instruction', 'Step 2 · Measured check', 'Step 3 · Hold point', 'Step 4 · Sign-off'])
    await wrapper.find('[aria-label="Move step 1 down"]').trigger('click')
    await wrapper.find('form').trigger('submit')
    expect(emittedBody(wrapper)!.procedure.steps.map((s: { key: string }) => s.key)).toEqual(['depth', 'clear-bed', 'isolate', 'final-signoff'])
  })

  it('removes a step and adds a new one before the closing sign-off', async () => {
    const wrapper = await mountEditor()
    await wrapper.find('[aria-label="Remove step 1"]').trigger('click')
    await wrapper.find('#p-new-kind').setValue('photo')
    await wrapper.findAll('button').find(b => b.text().includes('Add step'))!.trigger('click')
    expect(legends(wrapper)).toEqual(['Step 1 · Hold point', 'Step 2 · Measured check', 'Step 3 · Photo evidence', 'Step 4 · Sign-off'])
  })

  it('turns a filled-in new procedure into the publish body the API expects', async () => {
    const wrapper = await mountSuspended(LibraryProcedureEditor, { props: { submitLabel: 'Publish version 1' } })
    await wrapper.find('#p-title').setValue('  Check the collet nut  ')
    await wrapper.find('#p-summary').setValue('Make sure the collet nut is tight before a job.')
    await wrapper.find('#p-category').setValue('setup')
    await wrapper.find('#p-new-kind').setValue('check')
    await wrapper.findAll('button').find(b => b.text().includes('Add step'))!.trigger('click')
    const [first, check, last] = wrapper.findAll('[data-step-uid]')
    await first!.find('[id$="-title"]').setValue('Stop the spindle')
    await first!.find('[id$="-body"]').setValue('Stop the spindle and wait until it stands still.')
    await check!.find('[id$="-title"]').setValue('Measure the runout')
    await check!.find('[id$="-body"]').setValue('Put the dial gauge on the shank and turn by hand.')
    await check!.find('[id$="-label"]').setValue('Runout')
    await check!.find('[id$="-unit"]').setValue('mm')
    await check!.find('[id$="-max"]').setValue('0.02')
    await last!.find('[id$="-body"]').setValue('Sign when the nut is tight.')
    await last!.find('[id$="-statement"]').setValue('The collet nut is tight and the runout is in range.')
    await wrapper.find('#p-note').setValue('First version')
    await wrapper.find('form').trigger('submit')
    const body = emittedBody(wrapper)
    expect(body).toEqual({
      changeNote: 'First version',
      procedure: {
        title: 'Check the collet nut',
        summary: 'Make sure the collet nut is tight before a job.',
        category: 'setup',
        supplementNotice: SUPPLEMENT_NOTICE,
        steps: [
          { key: 'stop-the-spindle', kind: 'instruction', title: 'Stop the spindle', body: 'Stop the spindle and wait until it stands still.', guidance: '' },
          // An empty lower bound means no lower limit; the upper bound arrives as a number.
          { key: 'measure-the-runout', kind: 'check', title: 'Measure the runout', body: 'Put the dial gauge on the shank and turn by hand.', guidance: '', label: 'Runout', unit: 'mm', max: 0.02 },
          { key: 'final-signoff', kind: 'signoff', title: 'Sign off the run', body: 'Sign when the nut is tight.', guidance: '', statement: 'The collet nut is tight and the runout is in range.' },
        ],
      },
    })
    // The same body passes the server's schema unchanged.
    expect(ProcedureSchema.safeParse(body!.procedure).success).toBe(true)
  })

  it('previews a step as the Run screen shows it', async () => {
    const wrapper = await mountEditor()
    await wrapper.find('[aria-label="Preview step 2"]').trigger('click')
    const dialog = wrapper.find('[role="dialog"]')
    expect(dialog.text()).toContain('Step 2 of 4 · Hold point')
    expect(dialog.find('[data-signal-word]').attributes('data-signal-word')).toBe('WARNING')
    expect(dialog.text()).toContain('Unplugging a live cable can give a shock.')
  })
})

// Hue (degrees) and WCAG relative luminance of a #RRGGBB colour. The luminance formula is WCAG
// 2.2's definition for SC 1.4.3 (from memory).
function hue(hex: string) {
  const [r, g, b] = [1, 3, 5].map(i => Number.parseInt(hex.slice(i, i + 2), 16) / 255) as [number, number, number]
  const max = Math.max(r, g, b)
  const d = max - Math.min(r, g, b)
  const h = max === r ? ((g - b) / d) % 6 : max === g ? (b - r) / d + 2 : (r - g) / d + 4
  return (h * 60 + 360) % 360
}
function luminance(hex: string) {
  const lin = (c: number) => c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
  const [r, g, b] = [1, 3, 5].map(i => lin(Number.parseInt(hex.slice(i, i + 2), 16) / 255)) as [number, number, number]
  return 0.2126 * r + 0.7152 * g + 0.0722 * b
}
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number]
  return (hi + 0.05) / (lo + 0.05)
}
const hexOf = (css: string) => {
  const rgb = /rgb\((\d+), (\d+), (\d+)\)/.exec(css)
  return rgb ? `#${rgb.slice(1).map(n => Number(n).toString(16).padStart(2, '0')).join('')}` : css.toLowerCase()
}

describe('HoldPanel', () => {
  // ANSI Z535.4-2007 §4.14 / Z535.6: DANGER red, WARNING orange, CAUTION yellow,
  // NOTICE blue; the safety-alert symbol goes with every word except NOTICE. Hue bands are the
  // usual colour-name ranges of the HSL wheel (common practice, no published source).
  it.each([
    ['DANGER', 'red', true, [345, 15]],
    ['WARNING', 'orange', true, [15, 40]],
    ['CAUTION', 'yellow', true, [45, 60]],
    ['NOTICE', 'blue', false, [195, 240]],
  ] as const)('%s sits on a %s panel with readable text; alert symbol: %s', async (signalWord, _name, symbol, [from, to]) => {
    const wrapper = await mountSuspended(HoldPanel, { props: { signalWord, hazard: 'The cutter can cut you.', avoid: 'Keep your hands clear.' } })
    const band = wrapper.find(`[id="${wrapper.find('section').attributes('aria-labelledby')}"]`)
    expect(band.text()).toBe(signalWord)
    const style = (band.element as HTMLElement).style
    const background = hexOf(style.backgroundColor)
    const text = hexOf(style.color)
    const h = hue(background)
    expect(from > to ? h >= from || h <= to : h >= from && h <= to, `hue ${h.toFixed(0)} of ${background}`).toBe(true)
    // WCAG 2.2 SC 1.4.3: at least 4.5:1 for the signal word and the message.
    expect(contrast(background, text)).toBeGreaterThanOrEqual(4.5)
    expect(band.find('svg').exists()).toBe(symbol)
    expect(wrapper.text()).toContain('The cutter can cut you.')
    expect(wrapper.text()).toContain('Keep your hands clear.')
  })
})
