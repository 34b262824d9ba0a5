import { expect, test, type Page } from '@playwright/test'
import { signIn, startProcedure } from './helpers'

// Jogwise's Content-Security-Policy (server/plugins/security-headers.ts) in Chromium: signing in,
// the Floor, a run, the Planner, the Board and the prerendered app shell must load without a
// single violation. Chromium reports each one as a `securitypolicyviolation` event (W3C CSP
// Level 3, section 5.3) and as a console error starting "Refused to".

interface Violation { directive: string, blocked: string, source: string, page: string }

async function watch(page: Page) {
  const violations: Violation[] = []
  const refused: string[] = []
  await page.exposeBinding('__jogwiseCspViolation', (_source, v: Violation) => { violations.push(v) })
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as any).__jogwiseCspViolation({ directive: e.effectiveDirective, blocked: e.blockedURI, source: `${e.sourceFile}:${e.lineNumber}`, page: location.pathname })
    })
  })
  page.on('console', (m) => { if (/Content Security Policy|Refused to/i.test(m.text())) refused.push(m.text()) })
  return { violations, refused }
}

test('the app runs under its Content-Security-Policy with no violation', async ({ page }) => {
  const seen = await watch(page)
  await signIn(page, 'owner')
  // the service worker registers and takes control under the policy
  await page.evaluate(() => navigator.serviceWorker.ready)
  await expect.poll(() => page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true)

  await startProcedure(page, 'Bench Router', /Change the collet and bit/)
  await expect(page.getByTestId('primary-action')).toBeVisible()

  await page.goto('/planner')
  await expect(page.getByRole('heading', { name: 'Planner', level: 1 })).toBeVisible()

  await page.goto('/board')
  await page.getByRole('navigation', { name: 'Machines' }).getByRole('link', { name: 'Big Table' }).click()
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Big Table')

  // A camera photo is shown from a blob: address, small build images from data:
  const shown = await page.evaluate(async () => {
    const canvas = document.createElement('canvas')
    canvas.width = canvas.height = 8
    const blob = await new Promise<Blob>(resolve => canvas.toBlob(b => resolve(b!), 'image/png'))
    const load = (src: string) => new Promise<boolean>((resolve) => {
      const img = new Image()
      img.onload = () => resolve(true)
      img.onerror = () => resolve(false)
      img.src = src
    })
    return [await load(URL.createObjectURL(blob)), await load(canvas.toDataURL('image/png'))]
  })
  expect(shown).toEqual([true, true])

  // The prerendered shell (what the service worker serves offline) boots under its own header.
  const shell = await page.request.get('/shell')
  expect(shell.headers()['content-security-policy']).toMatch(/script-src 'self' 'wasm-unsafe-eval' 'sha256-/)
  await page.goto('/shell')
  await expect(page.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()

  expect(seen.violations).toEqual([])
  expect(seen.refused).toEqual([])
})

test('an inline script that Jogwise did not write is refused (the policy is really on)', async ({ page }) => {
  const seen = await watch(page)
  await page.goto('/login')
  const ran = await page.evaluate(() => {
    const s = document.createElement('script')
    s.textContent = 'window.__jogwiseInjected = true'
    document.body.appendChild(s)
    return !!(window as any).__jogwiseInjected
  })
  expect(ran).toBe(false)
  await expect.poll(() => seen.violations.map(v => v.directive)).toContain('script-src-elem')
})
