import { expect, test } from '@playwright/test'
import { hydrated, signIn } from './helpers'

// A new version of Jogwise reaches a tablet that has the app open (plugins/app-update.client.ts):
// the hourly check finds it, it waits for the person, "Later" keeps it waiting until the next
// start, and "Reload now" lets it take over and reloads the page under it.

test('a new version waits for the person, then takes over and reloads the page', async ({ page, context }) => {
  // The tablet first installs a service worker one byte-change older than the server's: the
  // server's own worker is then a new version. (Playwright can route a worker's first fetch, not
  // its update checks, so those reach the real /sw.js.)
  let olderServed = 0
  await context.route('**/sw.js', async (route) => {
    const current = await (await route.fetch()).text()
    olderServed++
    await route.fulfill({ status: 200, contentType: 'text/javascript', body: `${current}\n// the version before\n` })
  })
  // The clock is the page's own, so the hourly check can be reached without waiting an hour.
  await page.clock.install()
  await signIn(page, 'operator')
  await page.evaluate(() => navigator.serviceWorker.ready)
  await expect.poll(() => page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true)
  expect(olderServed).toBeGreaterThanOrEqual(1)
  await context.unroute('**/sw.js')

  // The manifest link (<VitePwaManifest /> in app.vue) points at the generated manifest.
  const href = await page.locator('link[rel="manifest"]').getAttribute('href')
  expect(href).toBe('/manifest.webmanifest')
  expect(await (await page.request.get(href!)).json()).toMatchObject({ id: '/', name: 'Jogwise', display: 'standalone' })

  const prompt = page.getByRole('alertdialog', { name: 'A new version of Jogwise is ready.' })
  const registration = () => page.evaluate(async () => {
    const r = await navigator.serviceWorker.getRegistration()
    return { waiting: !!r?.waiting, installing: !!r?.installing }
  })
  // Nothing has looked for a new version yet: nothing waits and no prompt shows.
  expect(await registration()).toEqual({ waiting: false, installing: false })
  await expect(prompt).toBeHidden()

  // An hour on the same screen: the check finds the new version, which installs and waits.
  await page.clock.fastForward('01:00:00')
  await expect(prompt).toBeVisible()
  expect(await registration()).toEqual({ waiting: true, installing: false })

  // "Later" hides the prompt and the new version keeps waiting; it is offered again at the next start.
  await prompt.getByRole('button', { name: 'Later' }).click()
  await expect(prompt).toBeHidden()
  expect((await registration()).waiting).toBe(true)
  await page.reload()
  await hydrated(page)
  await expect(prompt).toBeVisible()

  // "Reload now": the new version takes over and the page reloads under it.
  const reloaded = page.waitForEvent('load')
  await prompt.getByRole('button', { name: 'Reload now' }).click()
  await reloaded
  await hydrated(page)
  await expect(page.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
  await expect(prompt).toBeHidden()
  expect(await registration()).toEqual({ waiting: false, installing: false })
  expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true)
})
