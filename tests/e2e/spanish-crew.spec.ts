import { readFileSync } from 'node:fs'
import { expect, test, type Page } from '@playwright/test'
import { flatten, type MessageTree } from '../../shared/i18n/translate'
import { hydrated, signIn } from './helpers'

// The Crew, join, Library editor, paper-run and tag screens in Spanish (issue 16): the owner's
// tablet is switched to Spanish (the language cookie, as the browser's language would) and on
// each screen none of these screens' English messages is left. The messages are read from the
// locale files, so a string added in English only would be caught.

const en = flatten(JSON.parse(readFileSync('i18n/locales/en.json', 'utf8')) as MessageTree)
const es = flatten(JSON.parse(readFileSync('i18n/locales/es.json', 'utf8')) as MessageTree)
const SECTIONS = ['crew.', 'join.', 'editor.', 'paper.', 'roles.', 'stepKinds.', 'categories.']
// English pieces of two words or more (cut at placeholders) that read differently in Spanish.
const ENGLISH_PIECES = [...new Set(Object.entries(en)
  .filter(([key, text]) => SECTIONS.some(s => key.startsWith(s)) && !key.startsWith('paper.sheet.') && es[key] !== text)
  .flatMap(([, text]) => text.split(' | ').flatMap(form => form.split(/\{\w+\}/)))
  .map(piece => piece.trim().replace(/^[\s:;,.·—–()-]+|[\s:;,.·—–()-]+$/g, ''))
  .filter(piece => piece.split(/\s+/).length >= 2))]

async function englishOn(page: Page) {
  const text = await page.evaluate(() => document.body.innerText)
  return ENGLISH_PIECES.filter(piece => text.includes(piece))
}

async function open(page: Page, path: string, heading: string | RegExp) {
  await page.goto(path)
  await hydrated(page)
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading)
  await expect.soft.poll(() => englishOn(page), { message: `English on ${path}` }).toEqual([])
}

test('the owner\'s crew, Library editor, paper and tag screens in Spanish', async ({ page, context, baseURL }) => {
  await signIn(page, 'owner')
  await context.addCookies([{ name: 'jogwise-lang', value: 'es', url: baseURL! }])

  await open(page, '/crew', 'Equipo')
  await expect(page.getByRole('form', { name: 'Invitar por correo' }).getByRole('radio', { name: 'Formador' })).toHaveCount(1)
  await page.getByRole('button', { name: 'Añadir persona' }).click()
  await expect.soft.poll(() => englishOn(page), { message: 'English on the add form' }).toEqual([])
  await open(page, '/crew/qualifications', 'Habilitaciones')
  await open(page, '/crew/mail', 'Correo')

  await open(page, '/library/new', 'Procedimiento nuevo')
  // A step's own controls: kind, signal word with its meaning, the preview dialog.
  const first = page.getByRole('group', { name: /^Paso 1 · / })
  await first.getByLabel('Tipo de paso').selectOption('hold')
  await expect(first.getByRole('radio', { name: /ADVERTENCIA/ })).toBeChecked()
  await expect.soft.poll(() => englishOn(page), { message: 'English on a hold step' }).toEqual([])
  await first.getByRole('button', { name: 'Vista previa del paso 1' }).click()
  await expect(page.getByRole('dialog', { name: 'Vista previa de la pantalla del trabajo' })).toBeVisible()
  await expect.soft.poll(() => englishOn(page), { message: 'English in the preview' }).toEqual([])
  await page.getByRole('button', { name: 'Cerrar la vista previa' }).click()
  // Nothing typed is lost by leaving; the editor asks first (in Spanish).
  page.once('dialog', d => d.accept())

  const procedures = await (await page.request.get('/api/procedures')).json()
  const id = procedures[0].id
  await open(page, `/library/${id}/print`, /^Imprimir /)
  await expect(page.getByRole('radio', { name: /Carta/ })).toHaveCount(1)
  await expect(page.locator('[data-sheet-ready]')).toBeVisible({ timeout: 30_000 })

  await open(page, '/paper-runs/new', 'Anotar una pasada hecha en papel')
  await page.getByRole('button', { name: 'Guardar el trabajo en papel' }).click()
  await expect(page.getByRole('alert').filter({ hasText: 'El trabajo no se guardó' })).toContainText('Máquina: hay que elegirlo.')

  await open(page, '/machines/tags', 'Etiquetas y papel')
  await expect(page.getByRole('group', { name: 'Papel para las hojas de procedimiento impresas' })).toBeVisible()
})

test('the join page of a broken link, signed out, in the browser\'s Spanish', async ({ browser }) => {
  const guest = await browser.newContext({ locale: 'es-MX', extraHTTPHeaders: { 'accept-language': 'es-MX,es;q=0.9' } })
  const page = await guest.newPage()
  await open(page, `/join/${'a'.repeat(43)}`, 'Unirse a un taller')
  await expect(page.getByRole('alert')).toHaveText('Ninguna invitación corresponde a este enlace. Comprueba que se abrió el enlace entero.')
  await guest.close()
})
