// Script weight benchmark: in one run, builds the bare Nuxt fixture (tests/fixtures/bare-nuxt,
// the same Nuxt from the project's node_modules), serves it, and loads its home page and the
// Run screen of a signed-in operator (the app server that scripts/bench-server.sh started) in
// Chromium. Every script the page fetches until network idle is gzipped at level 9 and summed.
// Run: npm run bench:weight
import { spawn, spawnSync } from 'node:child_process'
import { resolve } from 'node:path'
import { gzipSync } from 'node:zlib'
import { chromium, type Browser } from '@playwright/test'
import { v7 as uuidv7 } from 'uuid'
import { DEMO, DEMO_PASSWORD } from '../tests/demo'
import { CHROMIUM } from '../tests/support/chromium'

const BASE = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3150'
const BARE_PORT = Number(process.env.JOGWISE_BENCH_BARE_PORT || Number(new URL(BASE).port) + 1)
const ROOT = resolve(import.meta.dirname, '..')
const BARE_OUT = resolve(ROOT, '.data/bare-nuxt-output')

function buildBare() {
  const built = spawnSync('npx', ['nuxt', 'build', 'tests/fixtures/bare-nuxt'], {
    cwd: ROOT, encoding: 'utf8', env: { ...process.env, BARE_NUXT_OUTPUT_DIR: BARE_OUT, BARE_NUXT_BUILD_DIR: resolve(ROOT, '.data/bare-nuxt-build') },
  })
  if (built.status !== 0) throw new Error(`bare Nuxt build failed:\n${built.stdout.slice(-2000)}\n${built.stderr.slice(-2000)}`)
}

async function waitFor(url: string) {
  for (let i = 0; i < 240; i++) {
    try { if ((await fetch(url)).ok) return }
    catch {}
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error(`${url} did not answer`)
}

/** Gzip-9 bytes of every script the page fetched until network idle. */
async function scriptWeight(browser: Browser, url: string, cookies: { name: string, value: string }[] = []) {
  // No service worker: a first visit, every script from the network and seen by the page.
  const context = await browser.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true, serviceWorkers: 'block' })
  if (cookies.length) await context.addCookies(cookies.map(c => ({ ...c, url })))
  const page = await context.newPage()
  const scripts = new Map<string, Promise<number>>()
  page.on('response', (res) => {
    if (res.request().resourceType() !== 'script' || scripts.has(res.url())) return
    scripts.set(res.url(), res.body().then(b => gzipSync(b, { level: 9 }).length).catch(() => 0))
  })
  await page.goto(url, { waitUntil: 'networkidle' })
  const sizes = await Promise.all([...scripts.values()])
  const finalUrl = page.url()
  await context.close()
  // JOGWISE_BENCH_VERBOSE=1 lists each script, largest first, to see where the weight is.
  if (process.env.JOGWISE_BENCH_VERBOSE) {
    const urls = [...scripts.keys()]
    for (const [i, size] of [...sizes.entries()].sort((a, b) => b[1] - a[1])) console.log(`  ${(size / 1024).toFixed(1).padStart(6)} KB  ${new URL(urls[i]!).pathname}`)
  }
  return { count: sizes.length, bytes: sizes.reduce((a, b) => a + b, 0), finalUrl }
}

buildBare()
const bare = spawn('node', [resolve(BARE_OUT, 'server/index.mjs')], { env: { ...process.env, PORT: String(BARE_PORT), HOST: '127.0.0.1' }, stdio: 'ignore' })
try {
  await waitFor(`http://127.0.0.1:${BARE_PORT}/`)

  // A signed-in operator with a run of their own, started as a tablet would (one run.started).
  const login = await fetch(`${BASE}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: DEMO.operator, password: DEMO_PASSWORD }) })
  if (!login.ok) throw new Error(`sign-in: ${login.status}`)
  const setCookies = login.headers.getSetCookie().map(c => c.split(';')[0]!)
  const cookie = setCookies.join('; ')
  const me = (await login.json() as any).user
  const get = async (path: string) => (await fetch(BASE + path, { headers: { cookie } })).json() as Promise<any>
  const machine = (await get('/api/machines'))[0]
  const version = (await get('/api/procedures') as any[]).find(p => p.slug === 'daily-start-up').current
  const runId = uuidv7()
  const started = { id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: me.id, deviceId: 'bench-weight', procedureVersionId: version.id, machineId: machine.id, mode: 'guided' }
  const sync = await fetch(`${BASE}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie, 'origin': BASE }, body: JSON.stringify({ deviceId: 'bench-weight', events: [started] }) })
  const synced = await sync.json() as any
  if (!sync.ok || synced.accepted.length !== 1) throw new Error(`run start: ${sync.status} ${JSON.stringify(synced)}`)

  const browser = await chromium.launch(CHROMIUM)
  const bareWeight = await scriptWeight(browser, `http://127.0.0.1:${BARE_PORT}/`)
  const runWeight = await scriptWeight(browser, `${BASE}/runs/${runId}`, setCookies.map(c => ({ name: c.split('=')[0]!, value: c.slice(c.indexOf('=') + 1) })))
  await browser.close()
  if (!runWeight.finalUrl.endsWith(`/runs/${runId}`)) throw new Error(`the Run screen went to ${runWeight.finalUrl}`)

  const kb = (n: number) => (n / 1024).toFixed(1)
  console.log(`bare Nuxt home page: ${bareWeight.count} scripts, ${kb(bareWeight.bytes)} KB gzip -9`)
  console.log(`Run screen:          ${runWeight.count} scripts, ${kb(runWeight.bytes)} KB gzip -9`)
  console.log(`ratio run/bare: ${(runWeight.bytes / bareWeight.bytes).toFixed(2)} (aim ≤ 1.6)`)
}
finally {
  bare.kill()
}
