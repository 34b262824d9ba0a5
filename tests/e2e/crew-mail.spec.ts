import { expect, test, type APIRequestContext } from '@playwright/test'
import { runReady, signIn, startProcedure, hydrated } from './helpers'

// Mail in the browser at 1024×768 with touch: the owner invites a trainer, the invite is read
// from the fake SMTP server's own REST API (maildev), the link is followed signed out, a
// password is chosen and the new trainer is signed in. A trainer's hold override reaches the
// owner's inbox with the reason.

const MAIL_API = process.env.JOGWISE_MAIL_API_URL || 'http://127.0.0.1:3428'

interface Caught { subject: string, text: string, headers: Record<string, string>, to: { address: string }[] }

async function mailTo(request: APIRequestContext, address: string, subject: RegExp, text = '') {
  let found: Caught | undefined
  await expect.poll(async () => {
    const all = await (await request.get(`${MAIL_API}/api/email`)).json() as Caught[]
    found = all.find(m => m.to.some(t => t.address === address) && subject.test(m.subject) && m.text.includes(text))
    return !!found
  }, { timeout: 30_000, message: `a mail to ${address} matching ${subject}` }).toBe(true)
  return found!
}

test('the owner invites a trainer who joins from the e-mailed link', async ({ page, browser, request }) => {
  const email = `e2e-trainer-${Date.now()}@demo.jogwise.test`
  await signIn(page, 'owner')
  await page.goto('/crew')
  await hydrated(page)
  const form = page.getByRole('form', { name: 'Invite by e-mail' })
  // A bad address is refused beside the field, before anything is sent.
  await form.getByLabel('E-mail to invite').fill('not-an-address')
  await form.getByRole('button', { name: 'Send invite' }).click()
  await expect(form.getByText('Enter a valid e-mail address.')).toBeVisible()
  await form.getByLabel('E-mail to invite').fill(email)
  await form.getByText('Trainer', { exact: true }).click()
  await form.getByRole('button', { name: 'Send invite' }).click()
  await expect(page.getByRole('status')).toContainText(`Invite sent to ${email}`)
  await expect(page.getByTestId(`invite-${email}`).getByTestId('invite-status')).toHaveText('Waiting')
  await page.screenshot({ path: 'test-results/crew-invite.png', fullPage: true })

  const mail = await mailTo(request, email, /invites you to/)
  const link = mail.text.match(/https?:\/\/\S+\/join\/[\w-]{43}/)?.[0]
  expect(link, mail.text).toBeTruthy()

  // The link is opened by someone with no sign-in, on another tablet.
  const guest = await browser.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true })
  const joiner = await guest.newPage()
  await joiner.goto(link!)
  await hydrated(joiner)
  await expect(joiner.getByRole('heading', { name: 'Join a shop' })).toBeVisible()
  await expect(joiner.getByTestId('join-email')).toHaveText(email)
  await expect(joiner.getByTestId('join-role')).toHaveText('Trainer')
  await joiner.getByLabel('Your name').fill('Odile Brenn')
  await joiner.getByLabel('Choose a password').fill('trainer-new-password')
  await joiner.getByLabel('Type it again').fill('trainer-new-passw0rd')
  await joiner.getByRole('button', { name: 'Join and sign in' }).click()
  await expect(joiner.getByText('The two passwords differ')).toBeVisible()
  await joiner.screenshot({ path: 'test-results/join-page.png', fullPage: true })
  await joiner.getByLabel('Type it again').fill('trainer-new-password')
  await joiner.getByRole('button', { name: 'Join and sign in' }).click()
  await expect(joiner.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
  // The link worked once only.
  await joiner.goto(link!)
  await hydrated(joiner)
  await expect(joiner.getByRole('alert')).toContainText('already been used')
  await guest.close()

  // The new trainer signs in with the chosen password on a fresh tablet.
  const fresh = await browser.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true })
  const again = await fresh.newPage()
  await again.goto('/login')
  await hydrated(again)
  await again.getByLabel('E-mail').fill(email)
  await again.getByLabel('Password').fill('trainer-new-password')
  await again.getByRole('button', { name: 'Sign in' }).click()
  await expect(again.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
  await fresh.close()

  await page.reload()
  await expect(page.getByTestId(`invite-${email}`).getByTestId('invite-status')).toHaveText('Joined')
  await expect(page.getByRole('listitem').filter({ hasText: email }).getByText('Odile Brenn', { exact: true })).toBeVisible()
  await page.getByRole('link', { name: 'Caught mail' }).click()
  await expect(page.getByRole('heading', { name: 'Caught by the local fake mail server' })).toBeVisible()
  await expect(page.getByTestId('caught-mail').filter({ hasText: mail.subject }).first()).toBeVisible()
  await page.screenshot({ path: 'test-results/crew-mail.png', fullPage: true })
})

test('a trainer\'s hold override reaches the owner by e-mail with the reason', async ({ page, browser, request }) => {
  const reason = `Dust shoe bracket cracked, collector running and guard taped, checked ${Date.now()}`
  await signIn(page, 'trainer')
  const runId = await startProcedure(page, 'Big Table', /Resurface the spoilboard/)
  const action = page.getByTestId('primary-action')
  await action.getByRole('button', { name: /Done — (next|last) step/ }).click()
  await expect(action.getByRole('button', { name: /Hold to acknowledge/ })).toBeVisible()
  await runReady(page)
  await page.getByRole('button', { name: 'Override this hold' }).click()
  await page.getByLabel(/Why is it safe to go past this hold/).fill(reason)
  await page.getByRole('button', { name: 'Override with this reason' }).click()
  // The run moves past the hold; the step list marks it overridden.
  await expect(page.getByText('Overridden', { exact: true })).toBeVisible()
  await page.screenshot({ path: 'test-results/override-run.png' })

  const alert = await mailTo(request, 'owner@demo.jogwise.test', /Hold overridden on Big Table/, reason)
  expect(alert.subject).toContain('Teodor Lind')
  expect(alert.text).toContain('Teodor Lind')
  expect(alert.text).toContain('Put on eye, hearing and dust protection')
  expect(alert.text).toMatch(new RegExp(`https?://\\S+/runs/${runId}/record`))
  // Exactly one alert for this override, even after the tablet's later syncs.
  await page.waitForTimeout(2000)
  const all = await (await request.get(`${MAIL_API}/api/email`)).json() as Caught[]
  expect(all.filter(m => m.text.includes(reason))).toHaveLength(1)

  // The owner finds it on the caught-mail page too, on their own tablet.
  const ownerContext = await browser.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true })
  const owner = await ownerContext.newPage()
  await signIn(owner, 'owner')
  await owner.goto('/crew/mail')
  await hydrated(owner)
  await expect(owner.getByTestId('caught-mail').filter({ hasText: 'Hold overridden on Big Table' }).first()).toBeVisible()
  await owner.getByTestId('caught-mail').filter({ hasText: 'Hold overridden on Big Table' }).first().getByRole('button').click()
  await expect(owner.getByText(reason)).toBeVisible()
  await owner.screenshot({ path: 'test-results/crew-mail-override.png', fullPage: true })
  await ownerContext.close()
})

test('a trainer sees the crew read-only, without invites or mail', async ({ page }) => {
  await signIn(page, 'trainer')
  await page.goto('/crew')
  await hydrated(page)
  await expect(page.getByText('Only the owner changes people and roles.')).toBeVisible()
  await expect(page.getByRole('listitem').filter({ hasText: 'Maren Oakes' })).toBeVisible()
  await expect(page.getByRole('form', { name: 'Invite by e-mail' })).toHaveCount(0)
  await expect(page.getByRole('combobox')).toHaveCount(0)
  await expect(page.getByRole('link', { name: /mail/i })).toHaveCount(0)
  // The owner's mail page sends anyone else back to the Floor.
  await page.goto('/crew/mail')
  await hydrated(page)
  await expect(page.getByRole('heading', { level: 1, name: 'Floor', exact: true })).toBeVisible()
})
