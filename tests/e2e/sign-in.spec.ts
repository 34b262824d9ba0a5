import { expect, test } from '@playwright/test'
import { DEMO, signIn, hydrated } from './helpers'

test.describe('sign-in at 1024×768', () => {
  for (const role of Object.keys(DEMO) as (keyof typeof DEMO)[]) {
    test(`${role} signs in and sees the Floor with the demo machines`, async ({ page }) => {
      await signIn(page, role)
      await expect(page.getByRole('article', { name: 'Big Table' })).toBeVisible()
      await expect(page.getByRole('article', { name: 'Bench Router' })).toBeVisible()
      const screens = page.getByRole('navigation', { name: 'Screens' })
      // Owners manage machines; owners and trainers see the crew; nobody gets a dead link.
      await expect(screens.getByRole('link', { name: 'Machines' })).toHaveCount(role === 'owner' ? 1 : 0)
      await expect(screens.getByRole('link', { name: 'Crew' })).toHaveCount(role === 'owner' || role === 'trainer' ? 1 : 0)
      await page.screenshot({ path: `test-results/floor-${role}.png` })
    })
  }

  test('a wrong password says so plainly', async ({ page }) => {
    await page.goto('/login')
    await hydrated(page)
    await page.getByLabel('E-mail').fill(DEMO.operator)
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect(page.getByRole('alert')).toContainText('do not match')
  })

  test('a screen opened signed out leads to sign-in and back', async ({ page }) => {
    await page.goto('/crew')
    await hydrated(page)
    await expect(page).toHaveURL(/\/login\?next=(%2F|\/)crew/)
  })

  test('primary touch targets are at least 64 CSS px', async ({ page }) => {
    await signIn(page, 'owner')
    for (const el of await page.locator('nav a, header button').all()) {
      const box = await el.boundingBox()
      expect(box!.width).toBeGreaterThanOrEqual(64)
      expect(box!.height).toBeGreaterThanOrEqual(64)
    }
  })
})

test('typing before the app has started is not taken and then lost: the page is inert until then', async ({ page }) => {
  // Hold the app's scripts back, as a slow tablet or a cold service worker would.
  let release!: () => void
  const held = new Promise<void>((resolve) => { release = resolve })
  await page.route(/\/_nuxt\/.*\.js$/, async (route) => { await held; await route.continue() })
  await page.goto('/login', { waitUntil: 'commit' })
  const email = page.locator('#email')
  await email.waitFor()
  await expect(page.locator('[data-starting]')).toHaveAttribute('inert', '')
  // A real tap and keystrokes, not Playwright's fill (which waits for the field to take input).
  const box = (await email.boundingBox())!
  await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2)
  await page.keyboard.type('early@example.test')
  await expect(email).toHaveValue('')
  release()
  await hydrated(page)
  await expect(page.locator('[inert]')).toHaveCount(0)
  await email.fill(DEMO.operator)
  await expect(email).toHaveValue(DEMO.operator)
})
