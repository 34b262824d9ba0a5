import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import type { VueWrapper } from '@vue/test-utils'
import { analyzeBoard, type BoardAnalysis } from '#shared/machining'
import BoardHeatMap from '~/components/board/BoardHeatMap.vue'
import BoardAnalysisPanel from '~/components/board/BoardAnalysisPanel.vue'

// Test vector F1, computed independently (SVD least squares; a linear program for the minimum zone):
// the exact saddle z = 0.10 + 0.001x − 0.0005y + 0.05(x−100)(y−100)/10⁴ on x, y ∈ {0, 100, 200} mm.
// Rows run front to back (row 0 at Y = 0). Expected: residuals ±0.05 at the corners, LSQ P-V
// 0.100, clean-up (z_max − z_min) 0.300 mm.
const F1 = [
  [0.15, 0.20, 0.25],
  [0.05, 0.15, 0.25],
  [-0.05, 0.10, 0.25],
]
function analysisOf(grid: number[][], extra: Record<string, unknown> = {}): BoardAnalysis {
  const r = analyzeBoard({ kind: 'height', grid, spacing: { x: 100, y: 100 }, minThickness: 12, ...extra })
  if (!r.ok) throw new Error(JSON.stringify(r.issues))
  return r.analysis
}
const cell = (w: VueWrapper, r: number, c: number) => w.find(`[data-cell="${r}-${c}"]`)

describe('BoardHeatMap with the F1 saddle', () => {
  it('shows the residual about the best-fit plane in every cell: ±0.05 mm at the corners, 0 elsewhere', async () => {
    const w = await mountSuspended(BoardHeatMap, { props: { analysis: analysisOf(F1), grid: F1, units: 'mm' } })
    await w.find('input[name="heatmap-view"][value="plane"]').setValue(true)
    const expected = [['+0.05', '0.00', '-0.05'], ['0.00', '0.00', '0.00'], ['-0.05', '0.00', '+0.05']]
    for (const [r, row] of expected.entries()) {
      for (const [c, text] of row.entries()) expect(cell(w, r, c).find('span').text()).toBe(text)
    }
    // The legend spans the peak-to-valley about the plane, 0.100 mm.
    expect(w.find('[data-testid="heatmap-legend"]').text()).toMatch(/-0\.05 Below the plane[\s\S]*Above the plane \+0\.05/)
    // Colour is never the only cue: the peak and the valley are named in words.
    expect(cell(w, 0, 0).text()).toContain('High')
    expect(cell(w, 0, 2).text()).toContain('Low')
    expect(cell(w, 0, 0).attributes('style')).not.toBe(cell(w, 0, 2).attributes('style'))
  })

  it('draws the back row first, as seen from the front of the machine', async () => {
    const w = await mountSuspended(BoardHeatMap, { props: { analysis: analysisOf(F1), grid: F1, units: 'mm' } })
    const firstRow = w.find('tbody tr').findAll('td').map(td => td.attributes('data-cell'))
    expect(firstRow).toEqual(['2-0', '2-1', '2-2'])
    expect(w.find('tbody tr th').text()).toBe('200')
  })

  it('shows what the clean-up cut takes at each cell, 0 at the lowest point and 0.30 mm at the highest', async () => {
    const w = await mountSuspended(BoardHeatMap, { props: { analysis: analysisOf(F1), grid: F1, units: 'mm' } })
    expect(cell(w, 2, 0).find('span').text()).toBe('0.00')
    expect(cell(w, 2, 0).text()).toContain('Low')
    for (const r of [0, 1, 2]) expect(cell(w, r, 2).find('span').text()).toBe('0.30')
    expect(w.find('[data-testid="heatmap-legend"]').text()).toMatch(/0\.00 Less to cut[\s\S]*More to cut 0\.30/)
  })

  it('converts to inches exactly: 0.05 mm is 0.0020 in (1 in = 25.4 mm, NBS Circular 572 addendum)', async () => {
    const w = await mountSuspended(BoardHeatMap, { props: { analysis: analysisOf(F1), grid: F1, units: 'in' } })
    await w.find('input[name="heatmap-view"][value="plane"]').setValue(true)
    expect(cell(w, 0, 0).find('span').text()).toBe('+0.0020')
    expect(w.find('thead').text()).toContain('7.87') // 200 mm = 7.874 in
  })
})

describe('BoardAnalysisPanel', () => {
  it('reports F1: LSQ peak-to-valley 0.10 mm, 0.30 mm against machine XY and a 0.30 mm clean-up (hand calculation)', async () => {
    const w = await mountSuspended(BoardAnalysisPanel, { props: { analysis: analysisOf(F1, { nominalThickness: 19 }), units: 'mm', minThicknessMm: 12 } })
    expect(w.find('[data-value="flatness-plane"]').text()).toBe('0.10 mm')
    expect(w.find('[data-value="flatness-xy"]').text()).toBe('0.30 mm')
    expect(w.find('[data-value="cleanup"]').text()).toBe('0.30 mm')
    expect(w.find('[role="alert"]').exists()).toBe(false)
  })

  it('warns plainly when the clean-up would leave the board under its minimum', async () => {
    // Thickness readings: the thinnest is 11.9 mm, so after the clean-up the whole board is
    // 11.9 mm (the cut reaches the lowest point), under a 12 mm minimum.
    const grid = [[12.3, 12.1], [11.9, 12.2]]
    const a = analysisOf(grid, { kind: 'thickness' })
    const w = await mountSuspended(BoardAnalysisPanel, { props: { analysis: a, units: 'mm', minThicknessMm: 12 } })
    const alert = w.find('[role="alert"]')
    expect(alert.text()).toContain('NOTICE')
    expect(alert.text()).toContain('Below the minimum thickness')
    expect(alert.text()).toContain('11.90 mm')
    expect(w.find('[data-value="facings-left"]').text()).toContain('0')
  })
})

describe('the Board in Spanish', () => {
  it('names the figures in Spanish and writes them with a decimal comma; units stay the machine\'s', async () => {
    const i18n = useI18n()
    await i18n.setLocale('es')
    try {
      const w = await mountSuspended(BoardAnalysisPanel, { props: { analysis: analysisOf(F1, { nominalThickness: 19 }), units: 'mm', minThicknessMm: 12 } })
      expect(w.text()).toContain('Planitud, zona mínima')
      expect(w.find('[data-value="flatness-plane"]').text()).toBe('0,10 mm')
      const map = await mountSuspended(BoardHeatMap, { props: { analysis: analysisOf(F1), grid: F1, units: 'mm' } })
      expect(cell(map, 2, 2).find('span').text()).toBe('0,30')
      expect(map.find('[data-testid="heatmap-legend"]').text()).toMatch(/0,00 Menos que cortar[\s\S]*Más que cortar 0,30/)
    }
    finally {
      await i18n.setLocale('en')
    }
  })
})
