import { readFile } from 'node:fs/promises'
import AxeBuilder from '@axe-core/playwright'
import { expect, test, type Page } from '@playwright/test'
import { v7 as uuidv7 } from 'uuid'
import { runReady, signIn, hydrated } from './helpers'

// The Planner at 1024×768 as an operator uses it beside the demo shop's Bench Router
// (620 × 620 × 90 mm travel, inch units). Word meanings from the NIST RS274/NGC interpreter
// specification, NISTIR 6556 §3.5.7 and §3.6: G20 inch units, M3 spindle on, M5 spindle off, M30 program end.

/** Signs in as the trainer (solo runs) and records a run that has reached its planner step. */
async function runAtPlannerStep(page: Page) {
  await signIn(page, 'trainer')
  const api = page.request
  const me = (await (await api.get('/api/me')).json()).user
  const bench = (await (await api.get('/api/machines')).json()).find((m: any) => m.name === 'Bench Router')
  const flatten = (await (await api.get('/api/procedures')).json()).find((p: any) => p.current.title === 'Flatten a slab or glued panel')
  const steps: any[] = flatten.current.steps
  // A run that has reached its planner step, recorded the way a tablet sends it.
  const runId = uuidv7()
  let second = 0
  const ev = (type: string, extra: Record<string, unknown>) => ({
    id: uuidv7(), runId, type, at: new Date(Date.now() - 3_600_000 + 1000 * second++).toISOString(), actorId: me.id, deviceId: 'planner-e2e', ...extra,
  })
  const events = [ev('run.started', { procedureVersionId: flatten.current.id, machineId: bench.id, mode: 'solo' })]
  for (const s of steps.slice(0, steps.findIndex(x => x.kind === 'planner'))) {
    if (s.kind === 'hold') events.push(ev('hold.acknowledged', { stepKey: s.key }))
    else if (s.kind === 'check') events.push(ev('value.recorded', { stepKey: s.key, value: ((s.min ?? 1) + (s.max ?? s.min ?? 1)) / 2, unit: s.unit }), ev('step.done', { stepKey: s.key }))
    else events.push(ev('step.done', { stepKey: s.key }))
  }
  const synced = await (await api.post('/api/sync', { data: { deviceId: 'planner-e2e', events } })).json()
  expect(synced.rejected).toEqual([])
  return { runId, bench, api }
}

test.describe('Planner at 1024×768', () => {
  test('an operator plans for the Bench Router, sees the preview and downloads the G-code', async ({ page }) => {
    await signIn(page, 'operator')
    await page.goto('/planner')
    await hydrated(page)
    await expect(page.getByRole('heading', { name: 'Planner', level: 1 })).toBeVisible()
    await page.getByLabel('Machine').selectOption({ label: 'Bench Router' })
    // The machine's own units and its whole travel as the area: 620 mm = 24.4094 in.
    await expect(page.getByLabel('inch')).toBeChecked()
    await expect(page.getByLabel(/^X size/)).toHaveValue('24.4094')
    await page.getByLabel(/^Stepover/).fill('60')

    const preview = page.getByTestId('planner-preview')
    await expect(preview).toBeVisible()
    // Lines along X stepping across Y = 24.4094 in at no more than 0.6 in (60 % of 1 in):
    // ceil(24.4094 / 0.6) = 41 gaps, 42 lines (hand calculation).
    await expect(preview.getByTestId('raster-line')).toHaveCount(42)
    await expect(preview.getByTestId('dim-x')).toHaveText('X 24.4094 in')
    await expect(page.getByTestId('travel-ok')).toHaveText('Stays inside the travel of Bench Router.')
    // Readable on the tablet: the drawing is at least 380 px wide and every control 64 px tall.
    expect((await preview.boundingBox())!.width).toBeGreaterThanOrEqual(380)
    const download = page.getByRole('button', { name: 'Download G-code' })
    expect((await download.boundingBox())!.height).toBeGreaterThanOrEqual(64)
    await page.screenshot({ path: 'test-results/planner-bench.png' })
    // No serious or critical WCAG 2.2 AA findings from axe-core.
    const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']).analyze()
    expect(axe.violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => v.id)).toEqual([])

    const [file] = await Promise.all([page.waitForEvent('download'), download.click()])
    expect(file.suggestedFilename()).toMatch(/^jogwise-surfacing-bench-router-\d{4}-\d{2}-\d{2}\.nc$/)
    const text = await readFile((await file.path())!, 'utf8')
    const lines = text.trimEnd().split('\n')
    expect(lines[0]).toBe('%')
    expect(lines[1]).toBe('(Jogwise surfacing program)')
    const blocks = lines.filter(l => l !== '%' && !l.startsWith('('))
    expect(blocks.slice(0, 5)).toEqual(['G20', 'G90', 'G17', 'G94', 'G54'])
    // Lift to safe Z and go over the start point before the spindle starts; G4 P in seconds (NISTIR 6556).
    expect(blocks.slice(5, 9)).toEqual(['G0 Z0.2000', 'G0 X0.0000 Y0.0000', 'S16000 M3', 'G4 P5'])
    expect(blocks.slice(-2)).toEqual(['M5', 'M30'])
    // 42 raster lines in each of the 2 passes of 0.02 in, each one G1 move along X.
    expect(text).toContain('(42 lines along X, zigzag')
    expect(blocks.filter(b => /^G1 X-?[\d.]+( F[\d.]+)?$/.test(b))).toHaveLength(84)
  })

  test('wrong values show their reason beside the field and block the download', async ({ page }) => {
    await signIn(page, 'operator')
    await page.goto('/planner')
    await hydrated(page)
    await page.getByLabel('Machine').selectOption({ label: 'Bench Router' })
    await page.getByLabel(/^Stepover/).fill('150')
    await expect(page.getByText('Stepover cannot be more than 100 % of the cutter diameter')).toBeVisible()
    await expect(page.getByLabel(/^Stepover/)).toHaveAttribute('aria-invalid', 'true')
    await expect(page.getByRole('button', { name: 'Download G-code' })).toBeDisabled()
    await page.getByLabel(/^Stepover/).fill('50')

    // 30 in of X on a 620 mm (24.4094 in) travel: 5.5906 in too much (hand calculation).
    await page.getByLabel(/^X size/).fill('30')
    await expect(page.getByTestId('travel-issues')).toContainText('X needs 30.0000 in of travel, 5.5906 in more than the machine travel of 24.4094 in.')
    await expect(page.getByRole('button', { name: 'Download G-code' })).toBeDisabled()
    await page.screenshot({ path: 'test-results/planner-errors.png', fullPage: true })

    // Switching to millimetres converts what was typed (1 in = 25.4 mm exactly).
    await page.getByLabel(/^X size/).fill('20')
    await page.getByText('mm', { exact: true }).click()
    await expect(page.getByLabel(/^X size/)).toHaveValue('508')
    await expect(page.getByLabel(/^Diameter/)).toHaveValue('25.4')
    await expect(page.getByRole('button', { name: 'Download G-code' })).toBeEnabled()
  })

  test('opened from a run\'s planner step, the plan is stored and attached to that step', async ({ page }) => {
    const { runId, bench, api } = await runAtPlannerStep(page)
    await page.goto(`/runs/${runId}`)
    await hydrated(page)
    await runReady(page)
    await page.getByRole('link', { name: 'Open the Planner' }).click()
    await expect(page.getByRole('heading', { name: 'Planner', level: 1 })).toBeVisible()
    await expect(page.getByLabel('Machine')).toHaveValue(String(bench.id))
    await page.screenshot({ path: 'test-results/planner-from-run.png' })
    await page.getByRole('button', { name: 'Attach this plan to the run' }).click()
    await expect(page).toHaveURL(new RegExp(`/runs/${runId}$`))
    await expect(page.getByRole('button', { name: 'Done — next step' })).toBeVisible()

    // The server keeps the plan with the run, and the run's event names it.
    let attached: any
    await expect.poll(async () => {
      const run = await (await api.get(`/api/runs/${runId}`)).json()
      attached = run.events.find((e: any) => e.type === 'plan.attached')
      return attached?.stepKey
    }).toBe('plan')
    expect(attached.planId).toMatch(/^\d+$/)
    expect(attached.summary).toMatch(/^Surfacing 24\.4094 in × 24\.4094 in/)
    const plan = await (await api.get(`/api/plans/${attached.planId}`)).json()
    expect(plan).toMatchObject({ runId, machineId: bench.id })
    expect(plan.gcode.split('\n').filter((l: string) => l && l !== '%' && !l.startsWith('('))[0]).toBe('G20')
  })

  test('offline, the plan\'s summary is attached to the run and reaches the server later', async ({ page, context }) => {
    const { runId } = await runAtPlannerStep(page)
    await page.goto(`/runs/${runId}`)
    await hydrated(page)
    await runReady(page)
    await page.getByRole('link', { name: 'Open the Planner' }).click()
    await expect(page.getByTestId('planner-preview')).toBeVisible()
    await context.setOffline(true)
    await expect(page.getByText('Offline: the summary is attached now')).toBeVisible()
    // The program is written in the browser: it downloads without a network.
    const [file] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download G-code' }).click()])
    expect((await readFile((await file.path())!, 'utf8')).trimEnd().split('\n').at(-2)).toBe('M30')
    await page.getByRole('button', { name: 'Attach this plan to the run' }).click()
    await expect(page).toHaveURL(new RegExp(`/runs/${runId}$`))
    await expect(page.getByRole('button', { name: 'Done — next step' })).toBeVisible()
    await context.setOffline(false)
    let attached: any
    await expect.poll(async () => {
      const run = await (await page.request.get(`/api/runs/${runId}`)).json()
      attached = run.events.find((e: any) => e.type === 'plan.attached')
      return attached?.stepKey
    }, { timeout: 30_000 }).toBe('plan')
    expect(attached.planId).toBeUndefined()
    expect(attached.summary).toMatch(/^Surfacing 24\.4094 in × 24\.4094 in/)
  })
})
