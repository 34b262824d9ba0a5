import { mkdtemp } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, expect, test, type Browser } from '@playwright/test'
import { machineTagUrl } from '../../shared/paper/tag-url'
import { writeQrVideo } from '../support/y4m'
import { DEMO, DEMO_PASSWORD, hydrated } from './helpers'

// "Scan a machine tag" on the Floor (issue 17) with Chromium's fake camera playing a generated
// video of a QR code (ISO/IEC 18004, drawn by the qrcode package; read in the app by the
// BarcodeDetector polyfill, zxing-wasm, served from our own origin). Each video needs its own
// browser, since the camera file is a launch argument.

const BASE = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'
let dir: string

test.beforeAll(async () => { dir = await mkdtemp(join(tmpdir(), 'jogwise-scan-')) })

async function browserWithCamera(video: string): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run',
      '--use-fake-ui-for-media-stream', '--use-fake-device-for-media-stream', `--use-file-for-fake-video-capture=${video}`],
  })
}

async function scan(text: (shop: { id: number }, machine: { id: number }) => string) {
  // Where this shop's server answers and which shop and machine it has.
  const probe = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium', args: ['--no-sandbox'] })
  const api = await probe.newContext({ baseURL: BASE })
  await api.request.post('/api/auth/login', { data: { email: DEMO.operator, password: DEMO_PASSWORD } })
  const shop = await (await api.request.get('/api/shop')).json()
  const machine = (await (await api.request.get('/api/machines')).json())[0]
  await probe.close()

  const video = join(dir, `${Date.now()}.y4m`)
  await writeQrVideo(video, text(shop, machine))
  const browser = await browserWithCamera(video)
  const context = await browser.newContext({ baseURL: BASE, viewport: { width: 1024, height: 768 }, hasTouch: true })
  const page = await context.newPage()
  const wasm: string[] = []
  page.on('request', r => r.url().endsWith('.wasm') && wasm.push(r.url()))
  await page.goto('/login')
  await hydrated(page)
  await page.getByLabel('E-mail').fill(DEMO.operator)
  await page.getByLabel('Password').fill(DEMO_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
  await page.getByRole('link', { name: 'Scan a machine tag' }).click()
  return { page, browser, machine, wasm }
}

test('a tag of this shop opens the machine\'s Start screen', async () => {
  const { page, browser, machine, wasm } = await scan((shop, m) => machineTagUrl(BASE, shop.id, m.id))
  try {
    await expect(page).toHaveURL(new RegExp(`/start/${machine.id}$`), { timeout: 20_000 })
    // The QR reader's WASM came from our own origin, never a CDN.
    expect(wasm.length).toBeGreaterThan(0)
    for (const url of wasm) expect(new URL(url).origin).toBe(new URL(BASE).origin)
  }
  finally { await browser.close() }
})

test('a code that is not a Jogwise tag gets a clear message', async () => {
  const { page, browser } = await scan(() => 'https://example.org/menu/today')
  try {
    await expect(page.locator('[data-scan-message]')).toHaveText(/not a Jogwise machine tag/, { timeout: 20_000 })
    await expect(page).toHaveURL(/\/scan$/)
  }
  finally { await browser.close() }
})

test('a tag of another shop gets a clear message', async () => {
  const { page, browser } = await scan((shop, m) => machineTagUrl(BASE, shop.id + 1000, m.id))
  try {
    await expect(page.locator('[data-scan-message]')).toHaveText(/another shop/, { timeout: 20_000 })
    await expect(page).toHaveURL(/\/scan$/)
  }
  finally { await browser.close() }
})
