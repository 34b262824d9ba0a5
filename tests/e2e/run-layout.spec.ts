import AxeBuilder from '@axe-core/playwright'
import { expect, test, type Locator, type Page } from '@playwright/test'
import { STARTER_LIBRARY } from '../../shared/procedures/starter-library'
import { pressAndHold, runReady, signIn, startProcedure, hydrated } from './helpers'

// Everything in reach on a tablet in both orientations: the side actions never scroll away,
// the longest hold of the starter library is readable whole in portrait, a step can be re-read
// from the list, and the sign-off keeps the step being signed in view beside the signer choice.

const stamp = Date.now()
const inView = async (page: Page, target: Locator) => {
  const box = (await target.boundingBox())!
  const { width, height } = page.viewportSize()!
  return box.y >= 0 && box.x >= 0 && box.y + box.height <= height && box.x + box.width <= width
}
// Contrast ratio of two opaque CSS rgb() colours, by WCAG 2.2's definitions of relative
// luminance and contrast ratio (SC 1.4.3 asks at least 4.5:1 for text).
function contrast(a: string, b: string) {
  const lum = (c: string) => {
    const [r, g, bl] = c.match(/\d+(\.\d+)?/g)!.slice(0, 3).map(Number).map((v) => {
      const x = v / 255
      return x <= 0.04045 ? x / 12.92 : ((x + 0.055) / 1.055) ** 2.4
    })
    return 0.2126 * r! + 0.7152 * g! + 0.0722 * bl!
  }
  const [hi, lo] = [lum(a), lum(b)].sort((x, y) => y - x)
  return (hi! + 0.05) / (lo! + 0.05)
}
const SIDE = ['Add a note', 'Stop the run', 'Who did what'] as const

// The longest hold of the starter library, by the text a person has to read.
const longestHold = STARTER_LIBRARY.flatMap(p => p.steps)
  .filter(s => s.kind === 'hold')
  .sort((a: any, b: any) => (b.body.length + b.hazard.length + b.avoid.length) - (a.body.length + a.hazard.length + a.avoid.length))[0]!

const longProcedure = (name: string) => ({
  title: `Layout check ${name} ${stamp}`,
  summary: 'The longest starter hold, then many short steps, for the layout checks.',
  category: 'maintenance',
  steps: [
    { ...longestHold, key: 'long-hold', needsTrainerSignoff: false },
    ...Array.from({ length: 30 }, (_, i) => ({ key: `step-${i + 1}`, kind: 'instruction', title: `Short step number ${i + 1}`, body: 'Do this short thing.' })),
    { key: 'hold-signed', kind: 'hold', title: 'Guards back on', body: 'Put every guard back.', signalWord: 'WARNING', hazard: 'A missing guard lets chips and hands reach the cutter.', avoid: 'Fit every guard before the spindle runs.', needsTrainerSignoff: true },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
  ],
})

for (const viewport of [{ width: 1024, height: 768 }, { width: 768, height: 1024 }]) {
  test.describe(`layout at ${viewport.width}×${viewport.height}`, () => {
    test.use({ viewport, hasTouch: true })

    test('the longest hold reads whole, side actions stay in reach deep into a long run, any step can be re-read', async ({ page }) => {
      test.setTimeout(120_000)
      await signIn(page, 'trainer')
      const made = await page.request.post('/api/procedures', { data: { procedure: longProcedure(`${viewport.width}`) } })
      expect(made.status(), await made.text()).toBe(201)
      await startProcedure(page, 'Bench Router', new RegExp(`Layout check ${viewport.width} ${stamp}`))

      // Portrait: the whole hold is readable without scrolling (signal-word panel, hazard, what
      // to do). Landscape: the signal word is in view and the card scrolls for the rest.
      const panel = page.locator('[data-signal-word]')
      await expect(panel).toBeVisible()
      if (viewport.height > viewport.width) {
        expect(await inView(page, panel)).toBe(true)
        const scroller = page.getByTestId('step-scroll')
        const [panelBox, scrollBox] = [(await panel.boundingBox())!, (await scroller.boundingBox())!]
        expect(panelBox.y + panelBox.height).toBeLessThanOrEqual(scrollBox.y + scrollBox.height + 1)
      }
      else {
        expect(await inView(page, panel.locator('p').first())).toBe(true)
      }
      expect(await inView(page, page.getByRole('button', { name: /Hold to acknowledge/ }))).toBe(true)
      await page.screenshot({ path: `test-results/layout-long-hold-${viewport.width}.png` })

      await pressAndHold(page, /Hold to acknowledge/)
      for (let i = 1; i <= 26; i++) {
        await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Short step number ${i}`)
        await runReady(page)
        await page.getByTestId('primary-action').getByRole('button', { name: /Done — next step/ }).click()
      }
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Short step number 27')
      await runReady(page)
      for (const name of SIDE) expect(await inView(page, page.getByRole(name === 'Who did what' ? 'link' : 'button', { name })), name).toBe(true)
      expect(await inView(page, page.getByRole('button', { name: /^Undo/ }))).toBe(true)
      expect(await page.evaluate(() => document.querySelector('main')!.scrollTop)).toBe(0)
      await page.screenshot({ path: `test-results/layout-deep-${viewport.width}.png` })

      // Re-read step 3 from the list (read-only), then back to the current step.
      if (viewport.width < viewport.height) await page.getByText('All steps').click()
      await page.getByRole('button', { name: /^Step 3: Short step number 2/ }).click()
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Short step number 2')
      await expect(page.getByTestId('primary-action')).toHaveCount(0)
      await page.getByRole('button', { name: 'Back to step 28' }).click()
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Short step number 27')
      await expect(page.getByTestId('primary-action')).toBeVisible()
    })
  })
}

test('a trainee\'s sign-off keeps the hold being signed in view beside the signer choice; axe on Start, Run and sign-off', async ({ page }) => {
  test.setTimeout(90_000)
  await signIn(page, 'trainee')
  await page.goto('/')
  await hydrated(page)
  await page.getByRole('article', { name: 'Big Table' }).getByRole('link', { name: 'Start a procedure' }).click()
  await page.getByRole('button', { name: /Resurface the spoilboard/ }).click()
  await expect(page.getByTestId('start-confirm')).toContainText('Guided')
  const axe = async (what: string) => {
    const result = await new AxeBuilder({ page }).analyze()
    expect(result.violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => `${what} ${v.id}: ${v.help}`)).toEqual([])
  }
  await axe('start')
  await page.getByRole('button', { name: 'Start the run' }).click()
  await runReady(page)
  await axe('run')
  const action = page.getByTestId('primary-action')
  // Step 1 instruction, step 2 protective gear (a hold), step 3 isolate the power (a hold a trainer signs).
  await action.getByRole('button', { name: /Done — next step/ }).click()
  for (let i = 0; i < 2; i++) await pressAndHold(page, /Hold to acknowledge/)
  await expect(action.getByText(/A trainer or the owner signs/)).toBeVisible()
  await runReady(page)
  // The hold being signed stays readable beside the signer choice: its title and signal word
  // are on the screen (the card scrolls for the rest).
  const panel = page.locator('[data-signal-word]')
  expect(await inView(page, panel.locator('p').first())).toBe(true)
  expect(await inView(page, page.getByRole('heading', { level: 1 }))).toBe(true)
  await action.getByText('Teodor Lind', { exact: true }).click()
  const chosen = action.getByText('Teodor Lind', { exact: true })
  await page.screenshot({ path: 'test-results/layout-signoff.png' })
  await axe('sign-off')
  // The chosen signer stays readable after a touch (no sticky hover colour under the finger).
  const [fg, bg] = await chosen.evaluate((el) => { const s = getComputedStyle(el); return [s.color, s.backgroundColor] })
  expect(contrast(fg!, bg!)).toBeGreaterThanOrEqual(4.5)
  for (const name of SIDE) expect(await inView(page, page.getByRole(name === 'Who did what' ? 'link' : 'button', { name })), name).toBe(true)
})

test('a run started by mistake is withdrawn without a reason and listed as withdrawn', async ({ page }) => {
  await signIn(page, 'trainer')
  const made = await page.request.post('/api/procedures', { data: { procedure: { ...longProcedure('withdraw'), title: `Withdraw check ${stamp}` } } })
  expect(made.status(), await made.text()).toBe(201)
  const runId = await startProcedure(page, 'Bench Router', new RegExp(`Withdraw check ${stamp}`))
  await expect(page.getByRole('button', { name: 'Stop the run' })).toHaveCount(0)
  await page.getByRole('button', { name: 'Withdraw the run' }).click()
  await page.getByRole('button', { name: 'Withdraw this run' }).click()
  await expect(page.getByText('This run was withdrawn before anything was done.')).toBeVisible()
  await expect.poll(async () => (await (await page.request.get(`/api/runs/${runId}`)).json()).run?.status, { timeout: 20_000 }).toBe('withdrawn')
  await page.goto('/ledger')
  await hydrated(page)
  await expect(page.getByTestId('ledger-run').filter({ hasText: `Withdraw check ${stamp}` })).toContainText('Withdrawn')
})
