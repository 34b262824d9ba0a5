import AxeBuilder from '@axe-core/playwright'
import { expect, test, type Page } from '@playwright/test'
import { signIn, hydrated } from './helpers'

// The seeded starter procedure every demo shop has (shared/procedures/starter-library.ts).
const RESURFACING = 'Resurface the spoilboard'

/** axe-core's serious and critical findings, named so a failure says what and where. */
async function seriousViolations(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']).analyze()
  return result.violations
    .filter(v => v.impact === 'serious' || v.impact === 'critical')
    .map(v => `${v.id}: ${v.nodes.map(n => n.target.join(' ')).join(', ')}`)
}

async function openResurfacing(page: Page) {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Library' }).click()
  await expect(page.getByRole('heading', { name: 'Library', level: 1 })).toBeVisible()
  await page.getByRole('link', { name: new RegExp(RESURFACING) }).click()
  await expect(page.getByRole('heading', { name: RESURFACING, level: 1 })).toBeVisible()
}

const versionShown = async (page: Page) =>
  Number(/Version (\d+)/.exec(await page.getByText(/· Version \d+ ·/).innerText())![1])

test.describe('Library at 1024×768', () => {
  test('everyone reads the Library, grouped by category, with no serious accessibility findings', async ({ page }) => {
    await signIn(page, 'operator')
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Library' }).click()
    await expect(page.getByRole('heading', { name: 'Surfacing and flattening', level: 2 })).toBeVisible()
    const card = page.getByRole('link', { name: new RegExp(RESURFACING) })
    await expect(card).toContainText(/\d+ steps/)
    // Gloved hands: every procedure card is a tap target of at least 64 CSS px (issue 3).
    for (const link of await page.locator('main ul a').all()) {
      const box = (await link.boundingBox())!
      expect(box.height).toBeGreaterThanOrEqual(64)
    }
    await expect(page.getByRole('link', { name: 'New procedure' })).toHaveCount(0)
    await page.screenshot({ path: 'test-results/library-list.png' })
    expect(await seriousViolations(page)).toEqual([])
  })

  test('an operator reads a procedure with its holds and history but cannot edit it', async ({ page }) => {
    await signIn(page, 'operator')
    await openResurfacing(page)
    await expect(page.getByRole('link', { name: 'Edit' })).toHaveCount(0)
    await expect(page.getByRole('button', { name: 'Retire' })).toHaveCount(0)
    // Holds carry their Z535 signal word (ANSI Z535.4-2007 §4.14); the starter library uses WARNING.
    await expect(page.locator('[data-signal-word="WARNING"]').first()).toBeVisible()
    await expect(page.getByRole('heading', { name: 'Version history' })).toBeVisible()
    await page.screenshot({ path: 'test-results/library-read.png', fullPage: false })
    expect(await seriousViolations(page)).toEqual([])
    // The editor is not reachable by address either.
    await page.goto(page.url() + '/edit')
    await hydrated(page)
    await expect(page.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
  })

  test('a trainer edits the resurfacing procedure, publishes, and the history shows the new version', async ({ page }) => {
    await signIn(page, 'trainer')
    await openResurfacing(page)
    const before = await versionShown(page)
    await page.getByRole('link', { name: 'Edit' }).click()
    await expect(page.getByRole('heading', { name: `Edit “${RESURFACING}”` })).toBeVisible()
    expect(await seriousViolations(page)).toEqual([])

    const first = page.getByRole('group', { name: /^Step 1 · / })
    const body = first.getByLabel('Step text')
    const marker = `Write the reading on the board log (edit ${Date.now()}).`
    // Replace an earlier run's sentence, so repeated runs against one database stay in length.
    const original = (await body.inputValue()).replace(/ Write the reading on the board log \(edit \d+\)\./g, '')
    await body.fill(`${original} ${marker}`)

    // The resurfacing procedure is long (30+ steps): one step at a time, with an outline.
    const outline = page.getByRole('navigation', { name: 'Step outline' })
    expect(await outline.getByRole('button').count()).toBeGreaterThanOrEqual(30)
    await expect(page.getByRole('group', { name: /^Step \d+ · / })).toHaveCount(1)
    // The step key is made from the title and folded away.
    await expect(first.getByLabel('Step key')).toBeHidden()
    await outline.getByRole('button', { name: /^2\./ }).click()
    await expect(outline.getByRole('button', { name: /^2\./ })).toHaveAttribute('aria-current', 'step')

    // A broken field is refused beside the field before anything is sent.
    const hold = page.getByRole('group', { name: /^Step 2 · Hold point/ })
    const hazard = hold.getByLabel('Hazard statement')
    const hazardText = await hazard.inputValue()
    await hazard.fill('Shock.')
    await page.getByRole('button', { name: `Publish version ${before + 1}` }).click()
    await expect(hazard).toHaveAttribute('aria-invalid', 'true')
    await expect(hold.getByText('Hazard statement needs at least 10 characters.')).toBeVisible()
    await expect(hazard).toBeFocused()
    await page.screenshot({ path: 'test-results/library-editor-error.png' })
    await hazard.fill(hazardText)

    // The preview shows the hold as the Run screen will.
    await page.getByRole('button', { name: 'Preview step 2', exact: true }).click()
    const preview = page.getByRole('dialog', { name: 'Run screen preview' })
    await expect(preview.locator('[data-signal-word]')).toBeVisible()
    await page.screenshot({ path: 'test-results/library-preview.png' })
    await preview.getByRole('button', { name: 'Close preview' }).click()

    await page.getByLabel('What changed (optional)').fill('Step 1 asks for the reading to be logged.')
    await page.getByRole('button', { name: `Publish version ${before + 1}` }).click()
    // A fresh database gives version 2; other suites sharing the database may publish too.
    await expect(page.getByRole('status')).toHaveText(/^Version \d+ published\.$/, { timeout: 30_000 })
    const after = Number(/\d+/.exec(await page.getByRole('status').innerText())![0])
    expect(after).toBeGreaterThan(before)
    await expect.poll(() => versionShown(page)).toBe(after)
    await expect(page.getByText(marker)).toBeVisible()
    const history = page.getByRole('list', { name: 'Version history' })
    const newest = history.getByRole('listitem').first()
    await expect(newest).toContainText(`Version ${after}`)
    await expect(newest).toContainText('current')
    await expect(newest).toContainText('Step 1 asks for the reading to be logged.')
    await expect(newest).toContainText('Teodor Lind')
    await expect(history.getByRole('listitem')).toHaveCount(after)
    await page.screenshot({ path: 'test-results/library-published.png' })
  })

  test('leaving the editor with unsaved changes asks first; staying keeps the changes', async ({ page }) => {
    await signIn(page, 'trainer')
    await openResurfacing(page)
    await page.getByRole('link', { name: 'Edit' }).click()
    await expect(page.getByRole('heading', { name: `Edit “${RESURFACING}”` })).toBeVisible()
    // Nothing changed yet: leaving asks nothing.
    const asked: string[] = []
    page.on('dialog', (d) => { asked.push(d.message()); void (asked.length === 1 ? d.dismiss() : d.accept()) })
    await page.getByRole('link', { name: 'Back without publishing' }).click()
    await expect(page.getByRole('link', { name: 'Edit' })).toBeVisible()
    expect(asked).toEqual([])
    await page.getByRole('link', { name: 'Edit' }).click()
    const title = page.getByLabel('Procedure title')
    await title.fill(`${await title.inputValue()} (draft)`)
    // First time: stay (dismissed); the change is still there.
    await page.getByRole('link', { name: 'Back without publishing' }).click()
    await expect.poll(() => asked.length).toBe(1)
    expect(asked[0]).toMatch(/Leave without publishing\?/)
    await expect(title).toHaveValue(/\(draft\)$/)
    // Second time: leave (accepted).
    await page.getByRole('link', { name: 'Back without publishing' }).click()
    await expect(page.getByRole('link', { name: 'Edit' })).toBeVisible()
    expect(asked).toHaveLength(2)
  })

  test('the owner marks an operator qualified; a trainer sees it read-only', async ({ page, browser }) => {
    await signIn(page, 'owner')
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Crew' }).click()
    await page.getByRole('link', { name: 'Qualifications' }).click()
    const toggle = page.getByRole('switch', { name: `Priya Castell may run ${RESURFACING} unsupervised` })
    const was = (await toggle.getAttribute('aria-checked')) === 'true'
    await toggle.click()
    await expect(toggle).toHaveAttribute('aria-checked', String(!was))
    const box = (await toggle.boundingBox())!
    expect(box.height).toBeGreaterThanOrEqual(64)
    expect(box.width).toBeGreaterThanOrEqual(64)
    await expect(page.getByText('Sam Ibarra')).toBeVisible()
    await page.screenshot({ path: 'test-results/library-qualifications.png' })
    expect(await seriousViolations(page)).toEqual([])
    await page.reload()
    await expect(toggle).toHaveAttribute('aria-checked', String(!was))

    const trainer = await browser.newPage({ viewport: { width: 1024, height: 768 }, hasTouch: true })
    await signIn(trainer, 'trainer')
    await trainer.goto('/crew/qualifications')
    await hydrated(trainer)
    await expect(trainer.getByRole('switch')).toHaveCount(0)
    await expect(trainer.getByText('Only the owner changes qualifications.')).toBeVisible()
    await trainer.close()

    await toggle.click()
    await expect(toggle).toHaveAttribute('aria-checked', String(was))
  })
})
