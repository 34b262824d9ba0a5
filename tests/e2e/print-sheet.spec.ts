import { readFile } from 'node:fs/promises'
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

/** The sheet the page made, as "Download PDF" saves it: its first bytes and its size. */
async function sheet(page: Page) {
  await expect(page.locator('[data-sheet-ready]')).toBeVisible({ timeout: 30_000 })
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download PDF' }).click()])
  const bytes = await readFile((await download.path())!)
  expect(download.suggestedFilename()).toMatch(/^Resurface-the-spoilboard-v\d+\.pdf$/)
  return { head: bytes.subarray(0, 5).toString('latin1'), size: bytes.length }
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
