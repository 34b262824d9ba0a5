import { expect, test, type APIRequestContext, type Page } from '@playwright/test'
import { pressAndHold, runReady, runScreen, signIn, signInForOffline, startProcedure, syncState, hydrated } from './helpers'

// Issue 11 "Sign-off without the network", in Chromium at 1024×768 with touch: a trainee's
// guided tool change loses the network before the trainer's sign-off; the trainer signs on the
// trainee's tablet offline (the PIN is sealed to the server's key), the run goes on to the end
// offline, and the server checks the signature when the queue arrives. The demo trainer's PIN
// is 2468 (server/utils/demo-shop.ts).

const MAIL_API = process.env.JOGWISE_MAIL_API_URL || 'http://127.0.0.1:3428'

/** Works through the run offline, one primary action at a time, signing with `pin`. */
async function finishOffline(page: Page, pin: string) {
  const action = page.getByTestId('primary-action')
  page.setDefaultTimeout(8000)
  let signed = 0
  for (let guard = 0; guard < 60; guard++) {
    // One gesture, one action: the screen takes input once the last step change has settled.
    await runReady(page)
    const screen = await runScreen(page)
    if (await action.getByRole('button', { name: /Finish the run/ }).isVisible()) {
      await action.getByRole('button', { name: /Finish the run/ }).click()
      await expect(action.getByText('This run is finished.')).toBeVisible()
      return signed
    }
    if (await action.getByRole('button', { name: /Hold to acknowledge/ }).isVisible()) await pressAndHold(page, /Hold to acknowledge/)
    else if (await action.getByText(/A trainer or the owner signs/).isVisible()) {
      await expect(action.getByText(/Offline: the signature is sealed on this tablet/)).toBeVisible()
      await action.getByText('Teodor Lind', { exact: true }).click()
      await action.getByLabel(/PIN/).fill(pin)
      await action.getByRole('button', { name: 'Sign', exact: true }).click()
      signed++
      if (signed === 1) {
        await expect(page.getByTestId('signoff-status')).toContainText('awaiting check')
        await page.screenshot({ path: 'test-results/offline-signoff-awaiting.png' })
      }
    }
    else if (await action.getByRole('button', { name: /Done — (next|last) step/ }).isVisible()) await action.getByRole('button', { name: /Done — (next|last) step/ }).click()
    else { await page.waitForTimeout(250); continue }
    await screen.movedOn()
  }
  throw new Error('the run did not finish within 60 actions')
}

/** A guided tool change by the trainee, taken offline at its first step. */
async function offlineGuidedRun(page: Page) {
  await signInForOffline(page, 'trainee')
  // The server's sealing key and the signers are in the tablet's cache before the Wi-Fi drops.
  await expect.poll(() => page.evaluate(async () => (await (await caches.open('jogwise-api')).keys()).map(r => new URL(r.url).pathname)), { timeout: 15_000 })
    .toEqual(expect.arrayContaining(['/api/signoff-key', '/api/signers']))
  const runId = await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await expect(page.getByText('Guided', { exact: true })).toBeVisible()
  await expect(syncState(page)).toHaveText('Online')
  await page.context().setOffline(true)
  await expect(syncState(page)).toContainText('Offline')
  return runId
}

async function serverRun(request: APIRequestContext, runId: string) {
  return (await request.get(`/api/runs/${runId}`)).json()
}

test('a trainer signs offline with the right PIN; the server verifies it at sync', async ({ browser }) => {
  test.setTimeout(180_000)
  const context = await browser.newContext()
  const page = await context.newPage()
  const runId = await offlineGuidedRun(page)
  expect(await finishOffline(page, '2468')).toBe(2)
  // Nothing readable of the PIN is kept on the tablet: only the sealed text is queued.
  const stored = await page.evaluate(() => new Promise<string>((resolve, reject) => {
    const open = indexedDB.open('jogwise')
    open.onsuccess = () => {
      const req = open.result.transaction('kv').objectStore('kv').get('queue')
      req.onsuccess = () => resolve(JSON.stringify(req.result))
      req.onerror = () => reject(req.error)
    }
  }))
  expect(stored).toContain('"seal":"js1.')
  // Ids, times and the seal itself are random or encoded text that may hold those four digits
  // by chance (a UUID once ended in 2468); every other value must not.
  const readable = JSON.stringify(JSON.parse(stored), (key, value) => /^(id|runId|eventId|deviceId|at|queuedAt|seal)$/.test(key) ? undefined : value)
  expect(readable).not.toContain('2468')

  await context.setOffline(false)
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  await expect.poll(async () => (await serverRun(page.request, runId)).run.status, { timeout: 30_000 }).toBe('finished')
  const { events } = await serverRun(page.request, runId)
  const signoffs = events.filter((e: any) => e.type === 'signoff.given')
  expect(signoffs.map((e: any) => e.verdict)).toEqual([{ status: 'verified' }, { status: 'verified' }])
  expect(events.every((e: any) => e.flag === null && e.seal === undefined)).toBe(true)
  await expect(page.getByTestId('signoff-status')).toHaveCount(0)
  await page.goto(`/runs/${runId}/record`)
  await hydrated(page)
  await expect(page.getByRole('list', { name: 'Record of the run' })).toContainText('Signed by Teodor Lind (trainer) — verified')
  await page.screenshot({ path: 'test-results/offline-signoff-verified.png' })
  await context.close()
})

test('a wrong PIN signed offline flags the run, reaches the Ledger and mails the owner', async ({ browser }) => {
  test.setTimeout(180_000)
  const context = await browser.newContext()
  const page = await context.newPage()
  const runId = await offlineGuidedRun(page)
  await finishOffline(page, '1357')
  await context.setOffline(false)
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  // The Run screen learns the server's verdict: the sign-off failed and the run is not finished.
  await expect(page.getByTestId('signoff-status')).toContainText('Sign-off failed its check', { timeout: 30_000 })
  await expect(page.getByTestId('primary-action').getByText(/A trainer or the owner signs/)).toBeVisible()
  await page.screenshot({ path: 'test-results/offline-signoff-failed.png' })
  const { run, events } = await serverRun(page.request, runId)
  expect(run.status).toBe('active')
  const failed = events.filter((e: any) => e.flag === 'signoff-failed')
  expect(failed).toHaveLength(2)
  expect(failed[0].verdict.reason).toContain('That PIN is not Teodor Lind\'s.')
  await page.goto(`/runs/${runId}/record`)
  await hydrated(page)
  await expect(page.getByRole('list', { name: 'Record of the run' })).toContainText('Not counted: The sign-off by Teodor Lind failed its check')
  await context.close()

  // The owner's Ledger lists it, and the alert reached the fake mail server.
  const owner = await browser.newContext()
  const ownerPage = await owner.newPage()
  await signIn(ownerPage, 'owner')
  await ownerPage.goto('/ledger?kind=signoff-failed')
  await hydrated(ownerPage)
  const rows = ownerPage.getByRole('table').getByRole('row').filter({ has: ownerPage.locator(`a[href^="/runs/${runId}/record"]`) })
  await expect(rows.filter({ hasText: 'Sign-off failed its check' }).filter({ hasText: 'That PIN is not Teodor Lind\'s.' })).toHaveCount(2)
  const ledger = await (await ownerPage.request.get('/api/ledger?kind=signoff-failed&pageSize=100')).json()
  expect(ledger.rows.filter((r: any) => r.runId === runId)).toHaveLength(2)
  await ownerPage.screenshot({ path: 'test-results/offline-signoff-ledger.png' })
  await expect.poll(async () => {
    const all = await (await ownerPage.request.get(`${MAIL_API}/api/email`)).json() as { subject: string, text: string, to: { address: string }[] }[]
    return all.some(m => m.to.some(t => t.address === 'owner@demo.jogwise.test') && /^Sign-off failed its check on Bench Router$/.test(m.subject) && m.text.includes(`/runs/${runId}/record`))
  }, { timeout: 30_000, message: 'the owner\'s alert mail' }).toBe(true)
  await owner.close()
})

test('offline, the Floor shows the run at the tablet\'s own latest step and keeps its due badges', async ({ browser }) => {
  const context = await browser.newContext()
  const page = await context.newPage()
  await signInForOffline(page, 'operator')
  const runId = await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await expect(syncState(page)).toHaveText('Online')
  await page.getByRole('link', { name: 'Floor', exact: true }).click()
  const tile = page.getByRole('article', { name: 'Bench Router' })
  const badge = tile.getByTestId('machine-run').filter({ has: page.locator(`a[href="/runs/${runId}"]`) })
  await expect(badge.getByText(/Step 1 of 11: Stop the spindle/)).toBeVisible()
  // The due list the Floor last had is kept on the tablet (the demo shop has three intervals),
  // and the tile's badge shows whether anything of this machine is due.
  const { run } = await (await page.request.get(`/api/runs/${runId}`)).json()
  const due = await (await page.request.get('/api/due')).json() as { machineId: number, status: string }[]
  expect(due.length).toBeGreaterThan(0)
  const badges = due.some(d => d.machineId === run.machineId && d.status !== 'ok') ? 1 : 0
  await expect(tile.getByTestId('machine-due')).toHaveCount(badges)
  await expect.poll(() => page.evaluate(() => new Promise<number>((resolve) => {
    const open = indexedDB.open('jogwise')
    open.onsuccess = () => {
      const req = open.result.transaction('kv').objectStore('kv').get('floor-due')
      req.onsuccess = () => resolve(Array.isArray(req.result) ? req.result.length : -1)
    }
  }))).toBe(due.length)

  await context.setOffline(true)
  await page.goto(`/runs/${runId}`)
  await hydrated(page)
  await pressAndHold(page, /Hold to acknowledge/)
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Handle cutters by the shank')
  await pressAndHold(page, /Hold to acknowledge/)
  await runReady(page)
  await page.getByRole('button', { name: /Done — next step/ }).click()
  await expect(syncState(page)).toContainText('3 waiting')
  await page.getByRole('link', { name: 'Floor', exact: true }).click()
  await expect(badge.getByText(/Step 4 of 11: Remove the old bit/)).toBeVisible()
  await expect(tile.getByTestId('machine-due')).toHaveCount(badges)
  // A hard reload offline too: the Floor comes from the shell and the tablet's own copies.
  await page.reload()
  await expect(badge.getByText(/Step 4 of 11: Remove the old bit/)).toBeVisible()
  await expect(tile.getByTestId('machine-due')).toHaveCount(badges)
  await page.screenshot({ path: 'test-results/offline-floor.png' })
  await context.close()
})
