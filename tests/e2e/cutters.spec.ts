import { readFile } from 'node:fs/promises'
import { expect, test } from '@playwright/test'
import { signIn, hydrated } from './helpers'

// The shop's cutter list at 1024×768: a trainer adds a cutter, an operator only reads the list,
// and the Planner takes the picked cutter's sizes and warns above its maximum speed.
test.describe('Cutters', () => {
  test('a trainer adds a cutter, an operator reads the list and the Planner picks it', async ({ page, browser }) => {
    const name = `Facing cutter 2 in ${Date.now()}`
    await signIn(page, 'trainer')
    await page.goto('/cutters')
    await hydrated(page)
    await expect(page.getByRole('heading', { name: 'Cutters', level: 1 })).toBeVisible()
    // The demo shop's invented cutters are there.
    await expect(page.getByText('Facing cutter 25 mm, 3 inserts')).toBeVisible()
    await page.getByRole('button', { name: 'Add cutter' }).click()
    const form = page.getByRole('form', { name: 'Cutter' })
    await form.getByLabel('Name').fill(name)
    await form.getByLabel('Kind').selectOption('surfacing')
    await form.getByLabel(/^Diameter/).fill('50.8')
    await form.getByLabel(/^Flutes/).fill('2')
    await form.getByLabel(/^Maximum speed/).fill('0')
    await form.getByRole('button', { name: 'Add cutter' }).click()
    await expect(form.getByText('Maximum speed must be at least 1000 rpm.')).toBeVisible()
    await form.getByLabel(/^Maximum speed/).fill('10000')
    await form.getByRole('button', { name: 'Add cutter' }).click()
    await expect(page.getByRole('status')).toHaveText(`${name} saved.`)
    const card = page.getByTestId('cutter').filter({ hasText: name })
    await expect(card).toContainText('Surfacing cutter · 50.80 mm · 2 flutes · max 10000 rpm')
    expect((await card.getByRole('button', { name: `Edit ${name}` }).boundingBox())!.height).toBeGreaterThanOrEqual(64)

    // An operator reads the same list but cannot change it.
    const operatorContext = await browser.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true, baseURL: test.info().project.use.baseURL })
    const operator = await operatorContext.newPage()
    await signIn(operator, 'operator')
    await operator.goto('/cutters')
    await hydrated(operator)
    await expect(operator.getByTestId('cutter').filter({ hasText: name })).toBeVisible()
    await expect(operator.getByRole('button', { name: 'Add cutter' })).toHaveCount(0)
    await expect(operator.getByRole('button', { name: `Edit ${name}` })).toHaveCount(0)

    // The Planner picks it: diameter and flutes follow, the speed starts at its maximum.
    await operator.goto('/planner')
    await hydrated(operator)
    await operator.getByLabel('Machine').selectOption({ label: 'Big Table' })
    await operator.getByLabel('Cutter from the shop\'s list').selectOption({ label: `${name} · 50.80 mm, 2 fl, max 10000 rpm` })
    await expect(operator.getByLabel(/^Diameter/)).toHaveValue('50.8')
    await expect(operator.getByLabel(/^Flutes/)).toHaveValue('2')
    await expect(operator.getByLabel(/^Spindle speed/)).toHaveValue('10000')
    await expect(operator.getByTestId('planner-warnings')).toHaveCount(0)
    // Above the cutter's maximum: a WARNING on screen and in the program header.
    await operator.getByLabel(/^Spindle speed/).fill('12000')
    await expect(operator.getByTestId('planner-warnings')).toContainText('WARNING Spindle speed 12000 rpm is above the cutter\'s maximum of 10000 rpm')
    await expect(operator.getByTestId('planner-zigzag-note')).toContainText('Zigzag alternates climb and conventional')
    await operator.getByText('One way', { exact: true }).click()
    await operator.getByText('Climb', { exact: true }).click()
    await operator.screenshot({ path: 'test-results/planner-cutter.png' })
    const [file] = await Promise.all([operator.waitForEvent('download'), operator.getByRole('button', { name: 'Download G-code' }).click()])
    const text = await readFile((await file.path())!, 'utf8')
    expect(text).toContain(`(Cutter ${name} rated to 10000 rpm)`)
    expect(text).toContain('(WARNING: Spindle speed 12000 rpm is above the cutter\'s maximum of 10000 rpm')
    expect(text).toContain('(Milling climb on every line')
    // Typing another diameter means the cutter is no longer the listed one.
    await operator.getByLabel(/^Diameter/).fill('40')
    await expect(operator.getByLabel('Cutter from the shop\'s list')).toHaveValue('0')
    await operatorContext.close()

    // The trainer removes it again; the list no longer shows it.
    await page.getByRole('button', { name: `Remove ${name}` }).click()
    await expect(page.getByRole('status')).toHaveText(`${name} removed from the list.`)
    await expect(page.getByTestId('cutter').filter({ hasText: name })).toHaveCount(0)
  })
})
