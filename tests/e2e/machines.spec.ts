import { expect, test } from '@playwright/test'
import { signIn, hydrated } from './helpers'

// The owner's Machines screen at 1024×768 with touch: a machine is added (a missing name is
// refused beside the field), shows on the Floor at once, is renamed, and once retired leaves
// the Floor but stays in the owner's list.

test('the owner adds, renames and retires a machine, and the Floor follows', async ({ page }) => {
  const name = `Side Router ${Date.now()}`
  await signIn(page, 'owner')
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Machines' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Machines', exact: true })).toBeVisible()

  await page.getByRole('button', { name: 'Add machine' }).click()
  const form = page.locator('form')
  await form.getByLabel('X travel (mm)').fill('610')
  await form.getByLabel('Y travel (mm)').fill('610')
  await form.getByLabel('Z travel (mm)').fill('90')
  await form.getByLabel('Spoilboard nominal thickness (mm)').fill('12.7')
  await form.getByLabel('Spoilboard minimum thickness (mm)').fill('8')
  await form.getByRole('button', { name: 'Add machine' }).click()
  await expect(form.getByText('Enter a name.')).toBeVisible()
  await form.getByLabel('Name').fill(name)
  await form.getByRole('button', { name: 'Add machine' }).click()
  await expect(page.getByRole('status')).toHaveText(`${name} added.`)
  await expect(page.getByRole('listitem').filter({ hasText: name })).toBeVisible()
  await page.screenshot({ path: 'test-results/machines-added.png' })

  // The Floor reads afresh: the new machine has its tile.
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Floor' }).click()
  await expect(page.getByRole('article', { name })).toBeVisible()

  // Renamed from its own page; the save answers at once.
  await page.goto('/machines')
  await hydrated(page)
  await page.getByRole('listitem').filter({ hasText: name }).getByRole('link', { name: 'Edit' }).click()
  await page.getByLabel('Name').fill(`${name} (left bay)`)
  await page.getByRole('button', { name: 'Save changes' }).click()
  await expect(page.getByRole('status')).toHaveText('Saved.', { timeout: 5000 })
  await expect(page.getByRole('button', { name: 'Save changes' })).toBeEnabled({ timeout: 5000 })
  await page.getByRole('link', { name: 'Machines' }).first().click()
  const row = page.getByRole('listitem').filter({ hasText: `${name} (left bay)` })
  await expect(row).toBeVisible()

  // Retired: gone from the Floor, kept in the owner's list.
  await row.getByRole('button', { name: 'Retire' }).click()
  await expect(row).toContainText('(retired)')
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Floor' }).click()
  await expect(page.getByRole('article', { name: 'Bench Router' })).toBeVisible()
  await expect(page.getByRole('article', { name: `${name} (left bay)` })).toHaveCount(0)
})
