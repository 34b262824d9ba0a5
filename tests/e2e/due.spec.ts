import { expect, request, test } from '@playwright/test'
import { v7 as uuidv7 } from 'uuid'
import { DEMO, DEMO_PASSWORD, signIn, hydrated } from './helpers'

// Due → Add interval at 1024×768 with touch (issue 11: the form threw before any request,
// because a number field's value was treated as text). The owner adds one interval by days and
// one by spindle hours on a demo router through the form and sees both on the Floor tile. The
// demo routers have been in the shop 60 days (server/utils/demo-shop.ts), so a 7-day interval
// never done is overdue; 2 spindle hours recorded on the machine are over a 1-hour interval.

const procedure = (title: string, withHours: boolean) => ({
  title, summary: 'A short maintenance procedure for the due list check.', category: 'maintenance',
  steps: [
    { key: 'look', kind: 'instruction', title: 'Look at the machine', body: 'Look over the machine.' },
    ...(withHours ? [{ key: 'hours', kind: 'check', title: 'Spindle hours run', body: 'Read the spindle hour meter for this job.', label: 'Spindle time', unit: 'h', min: 0 }] : []),
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The machine was looked over.' },
  ],
})

test('the owner adds an interval by days and one by spindle hours; both show on the Floor', async ({ browser, baseURL }) => {
  const stamp = Date.now()
  const byDays = `Way cover wipe-down ${stamp}`
  const byHours = `Collet nut inspection ${stamp}`
  const api = await request.newContext({ baseURL })
  expect((await api.post('/api/auth/login', { data: { email: DEMO.owner, password: DEMO_PASSWORD } })).status()).toBe(200)
  const ownerId = (await (await api.get('/api/me')).json()).user.id as number
  const machines = await (await api.get('/api/machines')).json() as { id: number, name: string }[]
  const bench = machines.find(m => m.name === 'Bench Router')!
  const days = await api.post('/api/procedures', { data: { procedure: procedure(byDays, false) } })
  const hours = await api.post('/api/procedures', { data: { procedure: procedure(byHours, true) } })
  expect(days.status()).toBe(201)
  expect(hours.status()).toBe(201)
  // Two spindle hours on the Bench Router, recorded by an open run of the hours procedure.
  const runId = uuidv7()
  const at = (s: number) => new Date(Date.now() - 60_000 + s * 1000).toISOString()
  const sync = await api.post('/api/sync', { data: { deviceId: 'due-e2e', events: [
    { id: uuidv7(), runId, type: 'run.started', at: at(0), actorId: ownerId, deviceId: 'due-e2e', procedureVersionId: (await hours.json()).versionId, machineId: bench.id, mode: 'guided' },
    { id: uuidv7(), runId, type: 'step.done', at: at(1), actorId: ownerId, deviceId: 'due-e2e', stepKey: 'look' },
    { id: uuidv7(), runId, type: 'value.recorded', at: at(2), actorId: ownerId, deviceId: 'due-e2e', stepKey: 'hours', value: 2, unit: 'h' },
  ] } })
  expect((await sync.json()).rejected).toEqual([])
  await api.dispose()

  const context = await browser.newContext()
  const page = await context.newPage()
  await signIn(page, 'owner')
  await page.goto('/due')
  await hydrated(page)
  const form = page.getByRole('form', { name: 'Add a maintenance interval' })
  const requests: string[] = []
  page.on('request', r => { if (r.url().endsWith('/api/maintenance-intervals') && r.method() === 'POST') requests.push(r.postData() ?? '') })

  await form.getByRole('combobox', { name: /^Procedure/ }).selectOption({ label: byDays })
  await form.getByRole('combobox', { name: /^Machine/ }).selectOption({ label: 'Bench Router' })
  await form.getByLabel('Every … days').fill('7')
  await form.getByRole('button', { name: 'Add interval' }).click()
  await expect(page.getByTestId('interval-row').filter({ hasText: byDays })).toBeVisible()

  await form.getByRole('combobox', { name: /^Procedure/ }).selectOption({ label: byHours })
  await form.getByRole('combobox', { name: /^Machine/ }).selectOption({ label: 'Bench Router' })
  await form.getByLabel('Every … spindle hours').fill('1')
  await form.getByRole('button', { name: 'Add interval' }).click()
  await expect(page.getByTestId('interval-row').filter({ hasText: byHours })).toBeVisible()
  // Numbers went out as numbers
  expect(requests.map(r => JSON.parse(r))).toEqual([
    expect.objectContaining({ everyDays: 7, everySpindleHours: null, machineId: bench.id }),
    expect.objectContaining({ everyDays: null, everySpindleHours: 1, machineId: bench.id }),
  ])
  await expect(page.getByTestId('due-item').filter({ hasText: byDays })).toContainText(/Not done yet; machine added \d+ days ago, every 7 days/)
  await expect(page.getByTestId('due-item').filter({ hasText: byHours })).toContainText(/of 1 spindle hours used/)
  await page.screenshot({ path: 'test-results/due-added.png', fullPage: true })

  // The Floor tile of the Bench Router names both
  await page.getByRole('link', { name: 'Floor', exact: true }).click()
  const tile = page.getByRole('article', { name: 'Bench Router' }).getByTestId('machine-due')
  await expect(tile).toContainText(byDays)
  await expect(tile).toContainText(byHours)
  await expect(tile.getByTestId('due-badge')).toContainText('OVERDUE')
  await page.screenshot({ path: 'test-results/due-floor.png' })
  await context.close()
})
