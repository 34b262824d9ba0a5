import { expect, test } from '@playwright/test'
import { signIn, hydrated } from './helpers'

// Forms that behave the same everywhere, at 1024×768 with touch: the decimal comma a tablet's
// number pad offers is accepted on Machines and the Planner as on the measured checks; a refused
// submit moves focus to the first error and scrolls it into view; the Planner says beside the
// button why Download waits, and asks before another machine's travel replaces typed sizes.

test('Machines: the first error gets focus and is in view; "610,5" is a number', async ({ page }) => {
  const name = `Comma Router ${Date.now()}`
  await signIn(page, 'owner')
  await page.goto('/machines')
  await hydrated(page)
  await page.getByRole('button', { name: 'Add machine' }).click()
  const form = page.locator('form')
  // Everything filled but the name, at the top of the form; submit from the bottom.
  await form.getByLabel('X travel (mm)').fill('610,5')
  await form.getByLabel('Y travel (mm)').fill('610')
  await form.getByLabel('Z travel (mm)').fill('90')
  await form.getByLabel('Spoilboard nominal thickness (mm)').fill('12,7')
  await form.getByLabel('Spoilboard minimum thickness (mm)').fill('8')
  await form.getByRole('button', { name: 'Add machine' }).click()
  await expect(form.getByText('Enter a name.')).toBeVisible()
  await expect(form.getByLabel('Name')).toBeFocused()
  await expect(form.getByLabel('Name')).toBeInViewport()
  await form.getByLabel('Name').fill(name)
  await form.getByRole('button', { name: 'Add machine' }).click()
  await expect(page.getByRole('status')).toHaveText(`${name} added.`)
  const machines = await (await page.request.get('/api/machines')).json()
  const made = machines.find((m: any) => m.name === name)
  expect(made.travelXMm).toBe(610.5)
  expect(made.spoilboardNominalMm).toBe(12.7)
})

test('Planner: a decimal comma, the reason Download waits, and a question before sizes are replaced', async ({ page }) => {
  await signIn(page, 'operator')
  await page.goto('/planner')
  await hydrated(page)
  await page.getByLabel('Machine').selectOption({ label: 'Big Table' })
  await page.getByText('mm', { exact: true }).click()
  await page.getByLabel(/^X size/).fill('610,5')
  await expect(page.getByTestId('planner-preview')).toBeVisible()
  await expect(page.getByRole('button', { name: 'Download G-code' })).toBeEnabled()

  // A wrong value: the button waits and says why, right beside it.
  await page.getByLabel(/^Stepover/).fill('150')
  await expect(page.getByRole('button', { name: 'Download G-code' })).toBeDisabled()
  await expect(page.locator('#p-download-reason')).toContainText('Download waits until every field is valid')
  await page.getByLabel(/^Stepover/).fill('50')

  // The typed X size is kept unless the person says to replace it.
  await page.getByLabel('Machine').selectOption({ label: 'Bench Router' })
  await expect(page.getByRole('alertdialog')).toContainText('Replace the sizes you typed with Bench Router')
  await page.getByRole('button', { name: 'Keep my sizes' }).click()
  await expect(page.getByLabel(/^X size/)).toHaveValue('610,5')
  await page.getByLabel('Machine').selectOption({ label: 'Big Table' })
  await page.getByRole('button', { name: 'Replace' }).click()
  await expect(page.getByRole('alertdialog')).toHaveCount(0)
  await expect(page.getByLabel(/^X size/)).not.toHaveValue('610,5')
})
