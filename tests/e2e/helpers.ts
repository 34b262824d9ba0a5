import { expect, type Locator, type Page } from '@playwright/test'

import { DEMO, DEMO_PASSWORD } from '../demo'

export { DEMO, DEMO_PASSWORD }

export async function signIn(page: Page, role: keyof typeof DEMO) {
  await page.goto('/login')
  await hydrated(page)
  await page.getByLabel('E-mail').fill(DEMO[role])
  await page.getByLabel('Password').fill(DEMO_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
}

/**
 * Waits until Vue has taken over the server-rendered page. Until then the page is inert (app.vue),
 * so a tap or typing there does nothing; a test that does not wait would act too early.
 */
export async function hydrated(page: Page) {
  // The app has started once it has mounted and lifted the inert cover of the server's page.
  await page.waitForFunction(() => !!(document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__
    && !document.querySelector('[data-starting]'))
}

/**
 * Press and hold a control (the deliberate gesture that acknowledges a hold). The finger stays
 * down until the screen has taken the hold, as a person lifts once the bar is full: taking it
 * locks the primary action while the finger is still down (composables/tap-guard.ts). A hold
 * not taken within `ms` of the press (the hold itself asks 1.5 s) fails.
 */
export async function pressAndHold(page: Page, name: RegExp | string, ms = 1800) {
  await runReady(page)
  const button = page.getByRole('button', { name })
  await button.hover()
  await page.mouse.down()
  try { await whenReady(page, false, ms, `the hold was not taken within ${ms} ms of the press`) }
  finally { await page.mouse.up() }
}

/** Signs in, waits until the service worker controls the page and has the reads cached. */
export async function signInForOffline(page: Page, role: keyof typeof DEMO) {
  await signIn(page, role)
  await waitForOfflineReads(page)
}

/** Waits until the service worker controls the page and has the Floor's reads in its cache. */
export async function waitForOfflineReads(page: Page) {
  await page.evaluate(() => navigator.serviceWorker.ready)
  await expect.poll(() => page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true)
  // The warm-up reads go through the service worker into its cache.
  await expect.poll(() => page.evaluate(async () => {
    const cache = await caches.open('jogwise-api')
    return (await cache.keys()).map(r => new URL(r.url).pathname)
  }), { timeout: 15_000 }).toEqual(expect.arrayContaining(['/api/machines', '/api/procedures']))
}

/** Starts a procedure on a machine from the Floor and waits for the Run screen. */
export async function startProcedure(page: Page, machine: string, procedure: RegExp) {
  await page.goto('/')
  await page.getByRole('article', { name: machine }).getByRole('link', { name: 'Start a procedure' }).click()
  await page.getByRole('button', { name: procedure }).click()
  // One confirmation screen (procedure, version, machine, guided or solo) before the run starts.
  await expect(page.getByTestId('start-confirm')).toHaveAttribute('data-ready', 'true')
  await page.getByRole('button', { name: 'Start the run' }).click()
  await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/)
  await expect(page.getByTestId('primary-action')).toBeVisible()
  await runReady(page)
  return page.url().split('/').pop()!
}

/**
 * After every action and change of step the Run screen ignores input until the finger has
 * lifted and a short settle time has passed (composables/tap-guard.ts); tests wait for it.
 */
export async function runReady(page: Page) {
  await whenReady(page, true, 10_000, 'the Run screen\'s primary action did not become ready')
}

/**
 * Waits until the Run screen's primary action area says data-ready="true" or "false". Looked
 * at every 50 ms: expect() backs off to 500 ms between looks, and a long run waits here at
 * every step, each time just after the tap guard's 400 ms settle.
 */
async function whenReady(page: Page, ready: boolean, timeout: number, message: string) {
  try {
    await page.waitForFunction(want => document.querySelector('[data-testid="primary-action-area"]')?.getAttribute('data-ready') === want,
      String(ready), { polling: 50, timeout })
  }
  catch (error) {
    // "Timeout" stays in the message: the run loops look again after a timeout.
    if (error instanceof Error && error.name === 'TimeoutError') throw new Error(`Timeout ${timeout} ms: ${message}`, { cause: error })
    throw error
  }
}

/**
 * What the Run screen shows before an action: the step's heading and the primary control's
 * element. `movedOn` then waits until the step has changed or the control was replaced by
 * another (the hold by the signer's form, the reading by "Done", the photo by "Done"): both
 * happen only once the action is in the run's state. A control that is only busy (a photo
 * being stored, a sign-off being sent) is the same element, so it does not count.
 */
export async function runScreen(page: Page) {
  const heading = (await page.getByRole('heading', { level: 1 }).textContent())?.trim() ?? ''
  const control = await page.evaluateHandle(() => document.querySelector('[data-testid="primary-action"]')?.firstElementChild ?? null)
  return {
    heading,
    /** Waits up to `timeout` ms for the screen to move on; after that the caller looks again. */
    async movedOn(timeout = 5000) {
      try {
        await page.waitForFunction(([heading, control]) => document.querySelector('h1')?.textContent?.trim() !== heading
          || (document.querySelector('[data-testid="primary-action"]')?.firstElementChild ?? null) !== control, [heading, control] as const, { polling: 50, timeout })
      }
      catch (error) {
        if (!(error instanceof Error && error.name === 'TimeoutError')) throw error
      }
      finally { await control.dispose() }
    },
  }
}

/**
 * Presses a button that appears only after an earlier action has been recorded (a photo is
 * stored on the tablet first, so its "Done" comes later): waits for the button, then for the
 * screen to settle after that change, so the press is not swallowed by the tap guard.
 */
export async function pressWhenSettled(page: Page, button: Locator) {
  await expect(button).toBeVisible()
  await runReady(page)
  await button.click()
}

export const syncState = (page: Page) => page.getByTestId('sync-state')
