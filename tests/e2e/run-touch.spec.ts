import { expect, test, type CDPSession, type Locator, type Page } from '@playwright/test'
import { pressAndHold, runReady, signIn, startProcedure } from './helpers'

// One gesture, one action, with real touch events (Input.dispatchTouchEvent through the
// DevTools protocol, the path a finger on the glass takes), at 1024×768 and 768×1024.
// A hold completes while the finger is still down; the next step's button is then drawn under
// that finger, and the lift must not press it. A double tap right after a step change must not
// press the new step's button either. Mouse and keyboard keep working.

const stamp = Date.now()
const procedure = (name: string) => ({
  title: `Touch check ${name} ${stamp}`,
  summary: 'An instruction, a hold, two more instructions and a sign-off, for the touch checks.',
  category: 'maintenance',
  steps: [
    { key: 'first', kind: 'instruction', title: 'Read the job sheet', body: 'Read the job sheet for the machine.' },
    { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock the isolator.', signalWord: 'WARNING', hazard: 'Unexpected start-up can injure hands near the cutter.', avoid: 'Lock the isolator off and prove nothing starts.' },
    { key: 'after', kind: 'instruction', title: 'Unplug the sensor cable', body: 'With the power isolated, unplug the sensor cable.' },
    { key: 'last', kind: 'instruction', title: 'Tidy the bed', body: 'Put the clamps and fences away.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
  ],
})

async function centre(target: Locator) {
  const box = (await target.boundingBox())!
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 }
}
async function touchDown(cdp: CDPSession, at: { x: number, y: number }) {
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x: at.x, y: at.y, id: 1 }] })
}
async function touchUp(cdp: CDPSession) {
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] })
}
async function tap(cdp: CDPSession, at: { x: number, y: number }) {
  await touchDown(cdp, at)
  await touchUp(cdp)
}
// The events the server stored for the run (none yet while its start is still in the queue).
const serverTypes = async (page: Page, runId: string) =>
  (((await (await page.request.get(`/api/runs/${runId}`)).json()).events ?? []) as { type: string, stepKey?: string }[]).map(e => `${e.type}${e.stepKey ? `:${e.stepKey}` : ''}`)
const syncedCount = (page: Page, runId: string, n: number) =>
  expect.poll(async () => (await serverTypes(page, runId)).length, { timeout: 20_000 }).toBe(n)

for (const viewport of [{ width: 1024, height: 768 }, { width: 768, height: 1024 }]) {
  test.describe(`touch at ${viewport.width}×${viewport.height}`, () => {
    test.use({ viewport, hasTouch: true })

    test('a touch hold acknowledges only the hold; the lift presses nothing', async ({ page }) => {
      await signIn(page, 'trainer')
      const made = await page.request.post('/api/procedures', { data: { procedure: procedure(`hold ${viewport.width}`) } })
      expect(made.status(), await made.text()).toBe(201)
      const runId = await startProcedure(page, 'Bench Router', new RegExp(`Touch check hold ${viewport.width} ${stamp}`))
      const cdp = await page.context().newCDPSession(page)
      const action = page.getByTestId('primary-action')

      await tap(cdp, await centre(action.getByRole('button', { name: /Done — next step/ })))
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Isolate the power')
      await runReady(page)

      // The finger goes down on the hold and stays there past the 1.5 s it needs.
      const hold = action.getByRole('button', { name: /Hold to acknowledge/ })
      const at = await centre(hold)
      await touchDown(cdp, at)
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Unplug the sensor cable', { timeout: 5000 })
      // The next step's button is now under the finger, inert while the finger is down.
      await expect(page.getByTestId('primary-action-area')).toHaveAttribute('data-ready', 'false')
      await expect(page.getByTestId('new-step-cue')).toBeVisible()
      await page.screenshot({ path: `test-results/touch-after-hold-${viewport.width}.png` })
      await page.waitForTimeout(500)
      await touchUp(cdp)

      await syncedCount(page, runId, 3)
      // Only the acknowledgement reached the server, and the step after the hold is still open.
      await page.waitForTimeout(1000)
      expect(await serverTypes(page, runId)).toEqual(['run.started', 'step.done:first', 'hold.acknowledged:isolate'])
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Unplug the sensor cable')
      await expect(action.getByRole('button', { name: /Done — next step/ })).toBeVisible()
      await expect(page.getByText('2 of 5 done').first()).toBeVisible()
    })

    test('a double tap right after a step change presses only the first button', async ({ page }) => {
      await signIn(page, 'trainer')
      const made = await page.request.post('/api/procedures', { data: { procedure: procedure(`double ${viewport.width}`) } })
      expect(made.status(), await made.text()).toBe(201)
      const runId = await startProcedure(page, 'Bench Router', new RegExp(`Touch check double ${viewport.width} ${stamp}`))
      const cdp = await page.context().newCDPSession(page)
      const action = page.getByTestId('primary-action')

      // A quick double tap on "Done": the second tap lands on the hold that replaced it, and on
      // nothing else.
      const done = await centre(action.getByRole('button', { name: /Done — next step/ }))
      await tap(cdp, done)
      await page.waitForTimeout(80)
      await tap(cdp, done)
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Isolate the power')
      await syncedCount(page, runId, 2)
      await page.waitForTimeout(1000)
      expect(await serverTypes(page, runId)).toEqual(['run.started', 'step.done:first'])

      // Past the hold by mouse (press and hold), then a double tap on the next step's "Done".
      await pressAndHold(page, /Hold to acknowledge/)
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Unplug the sensor cable')
      await runReady(page)
      const next = await centre(action.getByRole('button', { name: /Done — next step/ }))
      await tap(cdp, next)
      await page.waitForTimeout(80)
      await tap(cdp, next)
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Tidy the bed')
      await syncedCount(page, runId, 4)
      await page.waitForTimeout(1000)
      expect(await serverTypes(page, runId)).toEqual(['run.started', 'step.done:first', 'hold.acknowledged:isolate', 'step.done:after'])
      await expect(action.getByRole('button', { name: /Done — next step/ })).toBeVisible()
    })
  })
}

test('Space held on the hold acknowledges it and the keyboard goes on from there', async ({ page }) => {
  await signIn(page, 'trainer')
  const made = await page.request.post('/api/procedures', { data: { procedure: procedure('keys') } })
  expect(made.status(), await made.text()).toBe(201)
  const runId = await startProcedure(page, 'Bench Router', new RegExp(`Touch check keys ${stamp}`))
  const action = page.getByTestId('primary-action')
  await action.getByRole('button', { name: /Done — next step/ }).focus()
  await page.keyboard.press('Enter')
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Isolate the power')
  await runReady(page)
  await action.getByRole('button', { name: /Hold to acknowledge/ }).focus()
  await page.keyboard.down(' ')
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Unplug the sensor cable', { timeout: 5000 })
  await page.waitForTimeout(300)
  await page.keyboard.up(' ')
  await syncedCount(page, runId, 3)
  await page.waitForTimeout(800)
  expect(await serverTypes(page, runId)).toEqual(['run.started', 'step.done:first', 'hold.acknowledged:isolate'])
  await runReady(page)
  await action.getByRole('button', { name: /Done — next step/ }).focus()
  await page.keyboard.press('Enter')
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Tidy the bed')
})
