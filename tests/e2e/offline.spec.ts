import { expect, test } from '@playwright/test'
import { pressAndHold, runReady, signInForOffline, startProcedure, syncState, hydrated } from './helpers'

// The shop Wi-Fi drops: the run goes on, a hard reload still opens the Run screen from the
// service worker, and everything entered reaches the server once the network is back.

test('a run goes on offline, survives a hard reload and closing the tab, then syncs', async ({ browser }) => {
  const context = await browser.newContext()
  let page = await context.newPage()
  await signInForOffline(page, 'operator')
  const runId = await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await expect(syncState(page)).toHaveText('Online')

  await context.setOffline(true)
  await page.reload()
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Stop the spindle before you touch the cutter')
  await expect(syncState(page)).toContainText('Offline')

  // A hold, acknowledged offline with the deliberate gesture; then the next hold.
  await pressAndHold(page, /Hold to acknowledge/)
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Handle cutters by the shank')
  await pressAndHold(page, /Hold to acknowledge/)
  await runReady(page)
  await page.getByRole('button', { name: /Done — next step/ }).click()
  await expect(syncState(page)).toContainText('3 waiting')
  await page.screenshot({ path: 'test-results/offline-run.png' })

  // Close the tab and open the run again, still offline.
  await page.close()
  page = await context.newPage()
  await page.goto(`/runs/${runId}`)
  await hydrated(page)
  await expect(syncState(page)).toContainText('3 waiting')
  await expect(page.getByText('3 of 11 done')).toBeVisible()

  await context.setOffline(false)
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  const stored = await page.request.get(`/api/runs/${runId}`)
  const body = await stored.json()
  expect(body.events.map((e: any) => e.type)).toEqual(['run.started', 'hold.acknowledged', 'hold.acknowledged', 'step.done'])
  expect(body.events.every((e: any) => e.flag === null)).toBe(true)
  expect(body.run.currentStepKey).toBe(body.version.steps[3].key)
  await context.close()
})

test('two tablets on one run, both offline, both online again, end up showing the same', async ({ browser }) => {
  const a = await browser.newContext()
  const b = await browser.newContext()
  const pageA = await a.newPage()
  const pageB = await b.newPage()
  await signInForOffline(pageA, 'operator')
  await signInForOffline(pageB, 'operator')
  const runId = await startProcedure(pageA, 'Big Table', /Test the emergency stops/)
  await expect(syncState(pageA)).toHaveText('Online')
  await pageB.goto(`/runs/${runId}`)
  await hydrated(pageB)
  await expect(pageB.getByTestId('primary-action')).toBeVisible()

  await a.setOffline(true)
  await b.setOffline(true)
  await runReady(pageB)
  await pageA.getByRole('button', { name: 'Add a note' }).click()
  await pageA.getByLabel('Note').fill('Tablet A: stop button cap cracked.')
  await pageA.getByRole('button', { name: 'Save note' }).click()
  await pageB.getByRole('button', { name: 'Add a note' }).click()
  await pageB.getByLabel('Note').fill('Tablet B: checked the pendant too.')
  await pageB.getByRole('button', { name: 'Save note' }).click()

  await a.setOffline(false)
  await b.setOffline(false)
  await expect(syncState(pageA)).toHaveText('Online', { timeout: 30_000 })
  await expect(syncState(pageB)).toHaveText('Online', { timeout: 30_000 })
  // Each tablet learns the other's note at its next sync (on demand here: tap the chip).
  for (const page of [pageA, pageB]) {
    await expect(async () => {
      await page.getByRole('button', { name: /Send now/ }).click()
      await expect(page.getByText('Tablet A: stop button cap cracked.')).toBeVisible({ timeout: 2000 })
      await expect(page.getByText('Tablet B: checked the pendant too.')).toBeVisible({ timeout: 2000 })
    }).toPass({ timeout: 30_000 })
  }
  await a.close()
  await b.close()
})

test('when the session ended while offline, the queue waits for a new sign-in and then goes out', async ({ browser }) => {
  const context = await browser.newContext()
  const page = await context.newPage()
  await signInForOffline(page, 'operator')
  const runId = await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await expect(syncState(page)).toHaveText('Online')
  await context.setOffline(true)
  await pressAndHold(page, /Hold to acknowledge/)
  await expect(syncState(page)).toContainText('1 waiting')
  // The session cookie is gone (expired, or the server was reset) before the network returns.
  await context.clearCookies()
  await context.setOffline(false)
  const again = page.getByRole('link', { name: /Sign in again to send 1 waiting/ })
  await expect(again).toBeVisible({ timeout: 30_000 })
  await again.click()
  await page.getByLabel('E-mail').fill('operator@demo.jogwise.test')
  await page.getByLabel('Password').fill(process.env.JOGWISE_DEMO_PASSWORD || 'shopfloor-demo-1')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(new RegExp(`/runs/${runId}$`))
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  const body = await (await page.request.get(`/api/runs/${runId}`)).json()
  expect(body.events.map((e: any) => e.type)).toEqual(['run.started', 'hold.acknowledged'])
  await context.close()
})

test('steps the server has confirmed stay done after a reload offline, and after the network returns', async ({ browser }) => {
  // The service worker's copy of the run is the answer from the run's start; the tablet's own
  // copy holds what was synced since. A reload offline must not step the run back.
  const context = await browser.newContext()
  const page = await context.newPage()
  await signInForOffline(page, 'operator')
  const runId = await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await pressAndHold(page, /Hold to acknowledge/)
  await pressAndHold(page, /Hold to acknowledge/)
  await runReady(page)
  await page.getByRole('button', { name: /Done — next step/ }).click()
  await expect(page.getByText('3 of 11 done')).toBeVisible()
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  const stored = await (await page.request.get(`/api/runs/${runId}`)).json()
  expect(stored.events).toHaveLength(4)

  await context.setOffline(true)
  await page.reload()
  await hydrated(page)
  await expect(syncState(page)).toContainText('Offline')
  await expect(page.getByText('3 of 11 done')).toBeVisible()
  await expect(page.getByRole('heading', { level: 1 })).not.toHaveText('Stop the spindle before you touch the cutter')

  await context.setOffline(false)
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  await expect(page.getByText('3 of 11 done')).toBeVisible()
  // And a reload online agrees with the server.
  await page.reload()
  await hydrated(page)
  await expect(page.getByText('3 of 11 done')).toBeVisible()
  await context.close()
})
