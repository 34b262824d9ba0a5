import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import type { VueWrapper } from '@vue/test-utils'
import BoardReadingForm from '~/components/board/BoardReadingForm.vue'

const machine = { id: 7, units: 'mm' as const, travelXMm: 1250, travelYMm: 2500 }
const input = (w: VueWrapper, r: number, c: number) => w.find(`input[aria-label="Row ${r}, column ${c}"]`)

describe('BoardReadingForm', () => {
  it('offers 64 px inputs in tab order row by row from the front, and submits the grid as typed', async () => {
    const w = await mountSuspended(BoardReadingForm, { props: { machine } })
    const labels = w.findAll('input[aria-label^="Row"]').map(i => i.attributes('aria-label'))
    expect(labels).toEqual(['Row 1, column 1', 'Row 1, column 2', 'Row 1, column 3', 'Row 2, column 1', 'Row 2, column 2', 'Row 2, column 3', 'Row 3, column 1', 'Row 3, column 2', 'Row 3, column 3'])
    expect(input(w, 1, 1).classes()).toContain('field-input') // .field-input is min-h-touch (64 px)
    // The hand-calculated F1 saddle, typed row by row; a comma is taken as the decimal mark.
    const f1 = [['0.15', '0.20', '0.25'], ['0.05', '0.15', '0.25'], ['-0.05', '0,10', '0.25']]
    for (const [r, row] of f1.entries()) for (const [c, v] of row.entries()) await input(w, r + 1, c + 1).setValue(v)
    await w.find('#reading-spacing-x').setValue('100')
    await w.find('#reading-spacing-y').setValue('100')
    await w.find('form').trigger('submit')
    const [value] = w.emitted('submit')![0] as [any]
    expect(value).toMatchObject({ machineId: 7, kind: 'height', units: 'mm', spacing: { x: 100, y: 100 } })
    expect(value.grid).toEqual([[0.15, 0.2, 0.25], [0.05, 0.15, 0.25], [-0.05, 0.1, 0.25]])
  })

  it('names the bad cell and does not submit', async () => {
    const w = await mountSuspended(BoardReadingForm, { props: { machine } })
    await input(w, 2, 3).setValue('abc')
    expect(w.text()).toContain('Reading in row 2, column 3 is not a number.')
    expect(input(w, 2, 3).attributes('aria-invalid')).toBe('true')
    expect(input(w, 1, 1).attributes('aria-invalid')).toBeUndefined()
    await w.find('form').trigger('submit')
    expect(w.emitted('submit')).toBeUndefined()
    expect(w.text()).toContain('Reading in row 1, column 1 is not a number.')
  })

  it('resizes the grid and keeps what was typed', async () => {
    const w = await mountSuspended(BoardReadingForm, { props: { machine } })
    await input(w, 1, 1).setValue('0.4')
    // A common size is a radio in the one choice row (UiChoice).
    await w.find('input[name="grid-preset"][value="9x5"]').setValue(true)
    expect(w.findAll('input[aria-label^="Row"]')).toHaveLength(45)
    expect((input(w, 1, 1).element as HTMLInputElement).value).toBe('0.4')
    // Suggested spacing spreads the grid over the travel less 50 mm each side, in 10 mm steps.
    expect((w.find('#reading-spacing-x').element as HTMLInputElement).value).toBe('280')
    expect((w.find('#reading-spacing-y').element as HTMLInputElement).value).toBe('300')
  })
})
