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

/** Press and hold a control for `ms` (the deliberate gesture that acknowledges a hold). */
export async function pressAndHold(page: Page, name: RegExp | string, ms = 1800) {
  await runReady(page)
  const button = page.getByRole('button', { name })
  await button.hover()
  await page.mouse.down()
  await page.waitForTimeout(ms)
  await page.mouse.up()
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
  await expect(page.getByTestId('primary-action-area')).toHaveAttribute('data-ready', 'true')
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
