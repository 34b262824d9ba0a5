import { readFile } from 'node:fs/promises'
import { expect, request, test } from '@playwright/test'
import { parse } from 'csv-parse/sync'
import { makePng } from '../support/images'
import { DEMO, DEMO_PASSWORD, pressWhenSettled, runReady, signIn, startProcedure, syncState, hydrated } from './helpers'

// The Ledger at 1024×768 with touch: an operator's run stores a photo and a reading out of
// range; the owner finds the entry with the filters, opens the run's record with the photo,
// downloads the CSV with the same filters (read back with csv-parse) and sees the due list.

const grey = (): [number, number, number] => [128, 128, 128]

test('an operator\'s photo and out-of-range reading show in the owner\'s Ledger, record and CSV', async ({ browser, baseURL }) => {
  const title = `Collet runout check ${Date.now()}`
  const owner = await request.newContext({ baseURL })
  expect((await owner.post('/api/auth/login', { data: { email: DEMO.owner, password: DEMO_PASSWORD } })).status()).toBe(200)
  const made = await owner.post('/api/procedures', { data: { procedure: {
    title,
    summary: 'Photograph the collet and measure its runout.',
    category: 'maintenance',
    steps: [
      { key: 'collet-photo', kind: 'photo', title: 'Photograph the collet', body: 'Take one photo of the collet and nut.', subject: 'The collet and nut, close up.' },
      { key: 'runout', kind: 'check', title: 'Measure the runout', body: 'Measure runout at the collet with a dial gauge.', label: 'Runout', unit: 'mm', min: 0, max: 0.05 },
      { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The collet was checked as written.' },
    ],
  } } })
  expect(made.status(), await made.text()).toBe(201)
  const procedureId = (await made.json()).id as number
  await owner.dispose()

  // The operator at the machine
  const opContext = await browser.newContext()
  const op = await opContext.newPage()
  await signIn(op, 'operator')
  const runId = await startProcedure(op, 'Bench Router', new RegExp(title))
  const action = op.getByTestId('primary-action')
  await op.getByLabel('Take a photo').setInputFiles({ name: 'collet.png', mimeType: 'image/png', buffer: makePng(1200, 900, grey) })
  await expect(op.getByTestId('photo-preview')).toBeVisible()
  await action.getByRole('button', { name: 'Record evidence' }).click()
  await pressWhenSettled(op, action.getByRole('button', { name: /Done — (next|last) step/ }))
  await expect(op.getByRole('heading', { level: 1 })).toHaveText('Measure the runout')
  // The Bench Router works in inches, so the mm check is typed in inches: 0.005 in = 0.127 mm
  // (1 in = 25.4 mm exactly, NBS Circular 572 addendum), recorded in the step's own mm.
  await expect(action.getByLabel(/Runout/)).toHaveAccessibleName('Runout (in)')
  await action.getByLabel(/Runout/).fill('0.005')
  await action.getByLabel(/why is it acceptable/).fill('Collet nut worn, a new one is on order')
  await runReady(op)
  await action.getByRole('button', { name: 'Record reading' }).click()
  await pressWhenSettled(op, action.getByRole('button', { name: /Done — (next|last) step/ }))
  await expect(syncState(op)).toHaveText('Online', { timeout: 30_000 })
  // The picture reached the server
  await expect.poll(async () => {
    const events = (await (await op.request.get(`/api/runs/${runId}`)).json()).events as any[]
    return events.find(e => e.type === 'photo.attached')?.uploadId ?? null
  }, { timeout: 20_000 }).toMatch(/^[0-9a-f-]{36}$/)
  const uploadId = ((await (await op.request.get(`/api/runs/${runId}`)).json()).events as any[]).find(e => e.type === 'photo.attached').uploadId
  expect((await op.request.get(`/api/uploads/${uploadId}`)).status()).toBe(200)
  await opContext.close()

  // The owner's Ledger
  const context = await browser.newContext({ acceptDownloads: true })
  const page = await context.newPage()
  await signIn(page, 'owner')
  await expect(page.getByTestId('machine-due').first()).toBeVisible()
  await page.screenshot({ path: 'test-results/ledger-floor-due.png' })
  await page.getByRole('link', { name: 'Ledger', exact: true }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Ledger', exact: true })).toBeVisible()
  await page.getByLabel('Procedure').selectOption({ label: title })
  await page.getByLabel('Kind').selectOption({ label: 'Reading out of range' })
  await expect(page).toHaveURL(new RegExp(`procedureId=${procedureId}`))
  const rows = page.getByTestId('ledger-row')
  await expect(rows).toHaveCount(1)
  await expect(rows.first()).toContainText('0.127 mm is above the range (0 to 0.05 mm); reason: Collet nut worn, a new one is on order')
  await expect(rows.first()).toContainText('Priya Castell')
  await expect(page.getByTestId('pager-status').first()).toHaveText('Page 1 of 1 · 1 entries')
  await page.screenshot({ path: 'test-results/ledger-filtered.png' })

  // The CSV with the same filters, read back with csv-parse
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()])
  expect(download.suggestedFilename()).toMatch(/^jogwise-ledger-\d{4}-\d{2}-\d{2}\.csv$/)
  const records = parse(await readFile((await download.path())!), { columns: true }) as Record<string, string>[]
  expect(records).toHaveLength(1)
  expect(records[0]).toMatchObject({ 'Kind': 'Reading out of range', 'Kind (code)': 'out-of-range', 'Counted': 'yes', 'Reading': '0.127', 'Unit': 'mm', 'Person': 'Priya Castell', 'Machine': 'Bench Router', 'Procedure': title, 'Step': 'Measure the runout', 'Run': runId })
  expect(await rows.first().locator('td').nth(4).textContent()).toBe(records[0]!['What happened'])

  // "Record" on the row opens the run's record at that entry, highlighted, with the event it
  // is about highlighted too and its received time beside the claimed one.
  await rows.first().getByRole('link', { name: 'Record' }).click()
  await page.waitForURL(new RegExp(`/runs/${runId}/record#entry-\\d+$`))
  const entryId = new URL(page.url()).hash.slice('#entry-'.length)
  const entry = page.locator(`#entry-${entryId}`)
  await expect(entry).toHaveAttribute('aria-current', 'location')
  await expect(entry).toContainText('Reading out of range')
  await expect(entry).toBeInViewport()
  const event = page.locator('[data-testid="record-event"][aria-current="location"]')
  await expect(event).toContainText('Recorded a reading')
  await expect(event.getByTestId('received-at')).toContainText('received')
  await page.screenshot({ path: 'test-results/ledger-record-entry.png' })
  await page.goBack()
  await expect(rows).toHaveCount(1)

  // The run list under the same filters (the kind included) opens the run's record, with the photo itself
  const run = page.getByTestId('ledger-run').filter({ hasText: title })
  await expect(run).toContainText('1 photo')
  await run.click()
  await page.waitForURL(new RegExp(`/runs/${runId}/record$`))
  const photo = page.getByTestId('step-photo').locator('img')
  await expect(photo).toHaveAttribute('src', `/api/uploads/${uploadId}`)
  await expect.poll(() => photo.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(0)
  await expect(page.getByText('0.127 mm — reason: Collet nut worn, a new one is on order')).toBeVisible()
  await page.screenshot({ path: 'test-results/ledger-record.png', fullPage: true })

  // The due list from the demo shop's intervals
  await page.goto('/due')
  await hydrated(page)
  await expect(page.getByTestId('due-item').first()).toBeVisible()
  await expect(page.getByText('Maintenance intervals')).toBeVisible()
  await page.screenshot({ path: 'test-results/ledger-due.png', fullPage: true })
  await context.close()
})

test('a trainer reads the Ledger; an operator has no Ledger in the rail', async ({ browser }) => {
  const context = await browser.newContext()
  const page = await context.newPage()
  await signIn(page, 'trainer')
  await page.getByRole('link', { name: 'Ledger', exact: true }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Ledger', exact: true })).toBeVisible()
  await expect(page.getByTestId('ledger-table')).toBeVisible()
  await context.close()
  const opContext = await browser.newContext()
  const op = await opContext.newPage()
  await signIn(op, 'operator')
  await expect(op.getByRole('link', { name: 'Ledger', exact: true })).toHaveCount(0)
  await expect(op.getByRole('link', { name: 'Due', exact: true })).toBeVisible()
  await opContext.close()
})
