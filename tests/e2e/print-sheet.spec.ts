import { expect, test, type Page } from '@playwright/test'
import { signIn, signInForOffline } from './helpers'

// The printed procedure sheet (issue 17) is made in the browser, so it prints offline too.
// A PDF file starts with "%PDF-" (ISO 32000-1 §7.5.2, the file header).
const RESURFACING = 'Resurface the spoilboard'

async function openPrint(page: Page) {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Library' }).click()
  await page.getByRole('link', { name: new RegExp(RESURFACING) }).click()
  await page.getByRole('link', { name: 'Print sheet' }).click()
  await expect(page.getByRole('heading', { level: 1 })).toContainText(RESURFACING)
}

/** The sheet the page made: its first bytes and its size. */
async function sheet(page: Page) {
  const link = page.locator('[data-sheet-ready]')
  await expect(link).toBeVisible({ timeout: 20_000 })
  const href = await link.getAttribute('href')
  return page.evaluate(async (url) => {
    const bytes = new Uint8Array(await (await fetch(url!)).arrayBuffer())
    return { head: String.fromCharCode(...bytes.slice(0, 5)), size: bytes.length }
  }, href)
}

test('any member prints a procedure as a PDF sheet', async ({ page }) => {
  const violations: string[] = []
  page.on('console', m => m.text().includes('Content-Security-Policy') && violations.push(m.text()))
  await signIn(page, 'operator')
  await openPrint(page)
  const made = await sheet(page)
  expect(made.head).toBe('%PDF-')
  expect(made.size).toBeGreaterThan(10_000)
  expect(violations).toEqual([])
})

test('the sheet is made offline too', async ({ browser }) => {
  const context = await browser.newContext()
  const page = await context.newPage()
  await signInForOffline(page, 'operator')
  await openPrint(page)
  await sheet(page)
  await context.setOffline(true)
  await page.reload()
  const made = await sheet(page)
  expect(made.head).toBe('%PDF-')
  await context.close()
})
