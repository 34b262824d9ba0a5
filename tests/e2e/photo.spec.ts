import { expect, request, test } from '@playwright/test'
import { jpegSize, makePng } from '../support/images'
import { DEMO, DEMO_PASSWORD, signInForOffline, startProcedure, syncState } from './helpers'

// Photo evidence with the shop Wi-Fi down: the picture is scaled down on the tablet, kept in
// IndexedDB, shown on the step card from there, and uploaded once the network is back.

/** A board-like picture: brown with darker stripes every 100 px. */
const boardStripes = (x: number): [number, number, number] => Math.floor(x / 100) % 2 === 0 ? [181, 140, 92] : [140, 104, 64]

const localPhotoKeys = () => new Promise<string[]>((resolve, reject) => {
  const open = indexedDB.open('jogwise')
  open.onerror = () => reject(open.error)
  open.onsuccess = () => {
    const all = open.result.transaction('kv').objectStore('kv').getAllKeys()
    all.onsuccess = () => resolve((all.result as string[]).filter(k => String(k).startsWith('photo:')))
    all.onerror = () => reject(all.error)
  }
})

test('a photo taken offline waits on the tablet and is uploaded when the network returns', async ({ browser, baseURL }) => {
  const title = `Photograph the clear bed ${Date.now()}`
  const owner = await request.newContext({ baseURL })
  expect((await owner.post('/api/auth/login', { data: { email: DEMO.owner, password: DEMO_PASSWORD } })).status()).toBe(200)
  const made = await owner.post('/api/procedures', { data: { procedure: {
    title,
    summary: 'A photo of the bed before work starts.',
    category: 'daily',
    steps: [
      { key: 'bed-photo', kind: 'photo', title: 'Photograph the clear bed', body: 'Take one photo of the whole bed from above.', subject: 'The whole bed from above, nothing left on it.' },
      { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The bed was clear before work started.' },
    ],
  } } })
  expect(made.status(), await made.text()).toBe(201)
  await owner.dispose()

  const context = await browser.newContext()
  const page = await context.newPage()
  await signInForOffline(page, 'operator')
  const runId = await startProcedure(page, 'Bench Router', new RegExp(title))
  await expect(syncState(page)).toHaveText('Online')

  await context.setOffline(true)
  await expect(syncState(page)).toContainText('Offline')
  // A 2400 × 1200 picture, as a tablet camera might give (smaller than a real one, same shape).
  await page.getByLabel('Take a photo').setInputFiles({ name: 'bed.png', mimeType: 'image/png', buffer: makePng(2400, 1200, boardStripes) })
  await expect(page.getByTestId('photo-preview')).toBeVisible()
  await page.getByLabel('Note (optional)').fill('Bed clear, sensor unplugged.')
  await page.screenshot({ path: 'test-results/photo-capture.png' })
  await page.getByRole('button', { name: 'Record evidence' }).click()

  await expect(syncState(page)).toContainText('1 photo waiting')
  const thumb = page.getByTestId('step-photo').locator('img')
  await expect(thumb).toHaveAttribute('src', /^blob:/)
  await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(1600)
  expect(await page.evaluate(localPhotoKeys)).toHaveLength(1)
  await page.screenshot({ path: 'test-results/photo-waiting.png' })

  await context.setOffline(false)
  await expect(syncState(page)).toHaveText('Online', { timeout: 30_000 })
  expect(await page.evaluate(localPhotoKeys)).toEqual([])

  const stored = await (await page.request.get(`/api/runs/${runId}`)).json()
  const attached = stored.events.find((e: any) => e.type === 'photo.attached')
  expect(attached).toMatchObject({ stepKey: 'bed-photo', note: 'Bed clear, sensor unplugged.' })
  expect(attached.uploadId).toMatch(/^[0-9a-f-]{36}$/)
  const image = await page.request.get(`/api/uploads/${attached.uploadId}`)
  expect(image.status()).toBe(200)
  expect(image.headers()['content-type']).toBe('image/jpeg')
  const bytes = await image.body()
  expect([...bytes.subarray(0, 3)]).toEqual([0xFF, 0xD8, 0xFF])
  // Scaled to 1600 px on the long side, keeping the 2:1 shape.
  expect(jpegSize(bytes)).toEqual({ width: 1600, height: 800 })

  // Reopened, the step card now shows the server's copy.
  await page.reload()
  await expect(page.getByTestId('step-photo').locator('img')).toHaveAttribute('src', `/api/uploads/${attached.uploadId}`)
  await expect.poll(() => page.getByTestId('step-photo').locator('img').evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(1600)
  await page.screenshot({ path: 'test-results/photo-uploaded.png' })
  await context.close()
})
