// Offline reload benchmark: a signed-in operator's Run screen in Chromium (1024×768, touch),
// reloaded with the network cut, so the service worker serves the shell, the scripts and the
// run's reads from its caches, against the same reload with the network on. Each time runs from
// the reload until the step's heading shows and the page has started (the inert start-up
// cover lifted, app.vue). The app server comes from scripts/bench-server.sh.
// Run: npm run bench:offline
import { chromium, type Page } from '@playwright/test'
import { hydrated, signInForOffline, startProcedure } from '../tests/e2e/helpers'
import { CHROMIUM } from '../tests/support/chromium'

const BASE = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3150'
const ROUNDS = 15

async function reloadMs(page: Page) {
  const t0 = performance.now()
  await page.reload({ waitUntil: 'commit' })
  await page.getByRole('heading', { level: 1 }).waitFor({ state: 'visible' })
  await hydrated(page)
  return performance.now() - t0
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!

const browser = await chromium.launch(CHROMIUM)
try {
  const context = await browser.newContext({ baseURL: BASE, viewport: { width: 1024, height: 768 }, hasTouch: true })
  const page = await context.newPage()
  await signInForOffline(page, 'operator')
  const runId = await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  // One reload of each kind first, not counted: the first offline one also fills the caches.
  const online: number[] = []
  const offline: number[] = []
  await reloadMs(page)
  await context.setOffline(true)
  await reloadMs(page)
  for (let i = 0; i < ROUNDS; i++) {
    await context.setOffline(false)
    online.push(await reloadMs(page))
    await context.setOffline(true)
    offline.push(await reloadMs(page))
  }
  if (!page.url().endsWith(`/runs/${runId}`)) throw new Error(`the Run screen went to ${page.url()}`)
  const on = median(online)
  const off = median(offline)
  console.log(`Run screen reload, ${ROUNDS} rounds, median: online ${on.toFixed(0)} ms, offline from the service worker ${off.toFixed(0)} ms (fastest ${Math.min(...offline).toFixed(0)} ms)`)
  console.log(`ratio offline/online: ${(off / on).toFixed(2)} (offline ${off.toFixed(0)} ms; aim about 250 ms)`)
  await context.close()
}
finally {
  await browser.close()
}
