import AxeBuilder from '@axe-core/playwright'
import { expect, test, type Page } from '@playwright/test'
import { pressAndHold, runReady, runScreen, signIn, startProcedure, hydrated } from './helpers'

// The Run screen at 1024×768 with touch: a trainee's guided resurfacing run from the first step
// to the trainer's sign-off, holds that a quick tap cannot pass, resuming after a reload, and
// checks of accessibility and touch-target size.

async function versionOf(page: Page, runId: string) {
  const res = await page.request.get(`/api/runs/${runId}`)
  return (await res.json()).version as { steps: any[] }
}

async function trainerSigns(page: Page) {
  const panel = page.getByTestId('primary-action')
  await panel.getByText('Teodor Lind', { exact: true }).click()
  await panel.getByLabel(/PIN/).fill('2468')
  await panel.getByRole('button', { name: 'Sign', exact: true }).click()
}

/** Works through the run one primary action at a time, as the person at the machine would. */
async function completeRun(page: Page, runId: string, opts: { checkQuickTap?: boolean } = {}) {
  const { steps } = await versionOf(page, runId)
  const action = page.getByTestId('primary-action')
  let quickTapChecked = !opts.checkQuickTap
  // The screen can move on while a branch below is acting (a sign-off answer arriving, say):
  // an action that finds its control gone gives up after a few seconds and the loop looks again.
  page.setDefaultTimeout(8000)
  let checkingQuickTap = false
  for (let guard = 0; guard < 200; guard++) {
    try {
      await expect(action).toBeVisible()
      await runReady(page)
      const screen = await runScreen(page)
      const step = steps.find(s => s.title === screen.heading)
      if (await action.getByRole('button', { name: /Finish the run/ }).isVisible()) {
        await action.getByRole('button', { name: /Finish the run/ }).click()
        await expect(action.getByText('This run is finished.')).toBeVisible()
        return
      }
      const hold = action.getByRole('button', { name: /Hold to acknowledge/ })
      if (await hold.isVisible()) {
        if (!quickTapChecked) {
          checkingQuickTap = true
          // A quick tap and a double tap do nothing: the same hold is still waiting.
          // Read the hold's own heading now: the one read above may predate the last render.
          const holdTitle = (await page.getByRole('heading', { level: 1 }).textContent())!.trim()
          await hold.tap()
          await hold.dblclick()
          await page.waitForTimeout(300)
          await expect(page.getByRole('heading', { level: 1 })).toHaveText(holdTitle)
          await expect(hold).toBeVisible()
          await page.screenshot({ path: 'test-results/run-hold.png' })
          quickTapChecked = true
          checkingQuickTap = false
        }
        await pressAndHold(page, /Hold to acknowledge/)
      }
      else if (await action.getByText(/A trainer or the owner signs/).isVisible()) {
        await trainerSigns(page)
      }
      else if (await action.getByRole('button', { name: 'Record reading' }).isVisible()) {
        const value = step?.min !== undefined && step?.max !== undefined ? (step.min + step.max) / 2 : step?.min ?? step?.max ?? 1
        await action.getByRole('textbox').first().fill(String(value))
        await action.getByRole('button', { name: 'Record reading' }).click()
      }
      else if (await action.getByRole('button', { name: 'Record evidence' }).isVisible()) {
        // Any real picture will do: the app's own icon stands in for the camera's photo.
        await action.locator('input[type=file]').setInputFiles('public/icons/jogwise-512.png')
        await expect(action.getByRole('img')).toBeVisible()
        await action.getByRole('button', { name: 'Record evidence' }).click()
      }
      else if (await action.getByRole('link', { name: 'Open the Planner' }).isVisible()) {
        await action.getByRole('link', { name: 'Open the Planner' }).click()
        await page.getByRole('button', { name: /Attach this plan to the run/ }).click()
        await page.waitForURL(new RegExp(`/runs/${runId}$`))
      }
      else if (await action.getByRole('button', { name: /Done — (next|last) step/ }).isVisible()) {
        await action.getByRole('button', { name: /Done — (next|last) step/ }).click()
      }
      else {
        // The screen is between two states; look again.
        await page.waitForTimeout(250)
        continue
      }
      await screen.movedOn()
    }
    catch (error) {
      // The quick-tap check is an assertion about safety: its failure always fails the test.
      if (checkingQuickTap || !(error instanceof Error) || !/Timeout/i.test(error.message)) throw error
      continue
    }
  }
  throw new Error('the run did not finish within 200 actions')
}

test('a trainee does the whole resurfacing run, guided, and the trainer signs it off', async ({ page }) => {
  test.setTimeout(240_000)
  await signIn(page, 'trainee')
  const runId = await startProcedure(page, 'Big Table', /Resurface the spoilboard/)
  await expect(page.getByText('Guided', { exact: true })).toBeVisible()
  await expect(page.getByLabel('Why this step matters')).toBeVisible()
  await page.screenshot({ path: 'test-results/run-trainee-start.png' })
  await completeRun(page, runId, { checkQuickTap: true })
  await page.screenshot({ path: 'test-results/run-trainee-finished.png' })

  await expect.poll(async () => (await (await page.request.get(`/api/runs/${runId}`)).json()).run.status, { timeout: 30_000 }).toBe('finished')
  const { events } = await (await page.request.get(`/api/runs/${runId}`)).json()
  const signoffs = events.filter((e: any) => e.type === 'signoff.given')
  expect(signoffs.length).toBeGreaterThan(0)
  expect(signoffs.every((e: any) => e.signerRole === 'trainer')).toBe(true)
  expect(events.filter((e: any) => e.type === 'hold.acknowledged').length).toBeGreaterThan(5)
  expect(events.some((e: any) => e.type === 'plan.attached')).toBe(true)
  const photo = events.find((e: any) => e.type === 'photo.attached')
  await expect.poll(async () => (await page.request.get(`/api/uploads/${photo.uploadId}`)).status(), { timeout: 30_000 }).toBe(200)
  expect(events.every((e: any) => e.flag === null)).toBe(true)

  // The finished resurfacing run is a facing in the Big Table's board history.
  const { run } = await (await page.request.get(`/api/runs/${runId}`)).json()
  const facings = await (await page.request.get(`/api/machines/${run.machineId}/facings`)).json()
  const facing = facings.find((f: any) => f.runId === runId)
  expect(facing.depthMm).toBeGreaterThan(0)
  expect(facing.thicknessMm).toBeCloseTo(15.75, 6)
  await page.goto(`/runs/${runId}/record`)
  await hydrated(page)
  await expect(page.getByRole('list', { name: 'Record of the run' })).toContainText('Signed by Teodor Lind (trainer)')
  await page.screenshot({ path: 'test-results/run-record.png' })
})

test('an operator resumes a run exactly where it was after a reload', async ({ page }) => {
  await signIn(page, 'operator')
  await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await pressAndHold(page, /Hold to acknowledge/)
  await pressAndHold(page, /Hold to acknowledge/)
  const before = await page.getByRole('heading', { level: 1 }).textContent()
  await page.reload()
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(before!)
  await expect(page.getByText('2 of 11 done')).toBeVisible()
  // Undo takes back only the last action.
  await runReady(page)
  await page.getByRole('button', { name: 'Add a note' }).click()
  await page.getByLabel('Note').fill('Collet nut threads look worn.')
  await page.getByRole('button', { name: 'Save note' }).click()
  await runReady(page)
  await page.getByRole('button', { name: /^Undo note/ }).click()
  await expect(page.getByText('Collet nut threads look worn.')).toHaveCount(0)
})

test('every control on the Run screen is at least 64×64 CSS px', async ({ page }) => {
  await signIn(page, 'trainer')
  await startProcedure(page, 'Big Table', /Resurface the spoilboard/)
  await page.getByRole('button', { name: 'Add a note' }).click()
  // WCAG 2.2 SC 2.5.5 (Target Size, Enhanced) asks 44×44; Jogwise aims for 64 for gloved hands.
  const small: string[] = []
  for (const el of await page.locator('button:visible, a:visible, input:visible, textarea:visible, select:visible').all()) {
    const box = await el.boundingBox()
    if (!box || box.width <= 1 || box.height <= 1) continue
    if (box.width < 64 || box.height < 64) small.push(`${await el.evaluate(e => e.outerHTML.slice(0, 80))} ${box.width}×${box.height}`)
  }
  expect(small).toEqual([])
})

for (const [name, path] of [['Floor', '/'], ['Library', '/library']] as const) {
  test(`axe finds no serious or critical problem on the ${name}`, async ({ page }) => {
    await signIn(page, 'operator')
    await page.goto(path)
    await hydrated(page)
    await page.waitForLoadState('networkidle')
    const result = await new AxeBuilder({ page }).analyze()
    expect(result.violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => `${v.id}: ${v.help}`)).toEqual([])
  })
}

test('axe finds no serious or critical problem on the Run screen, light and dark', async ({ page }) => {
  await signIn(page, 'trainee')
  await startProcedure(page, 'Big Table', /Resurface the spoilboard/)
  await page.getByRole('button', { name: /Done — next step/ }).click()
  await expect(page.getByRole('button', { name: /Hold to acknowledge/ })).toBeVisible()
  for (const theme of ['light', 'dark']) {
    if (theme === 'dark') {
      await page.getByRole('button', { name: 'Use the dark theme' }).click()
      await expect(page.locator('html')).toHaveClass(/\bdark\b/)
      // Buttons fade their colours; contrast is measured once every fade has ended.
      await expect.poll(() => page.evaluate(() => document.getAnimations().length)).toBe(0)
    }
    const result = await new AxeBuilder({ page }).analyze()
    expect(result.violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => `${theme} ${v.id}: ${v.help} ${v.nodes.map(n => n.target.join(' ')).slice(0, 3)}`)).toEqual([])
  }
  await page.screenshot({ path: 'test-results/run-dark.png' })
})
