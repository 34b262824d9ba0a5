import { describe, expect, it } from 'vitest'
import { matchTemplate, pickLanguage, translateIssues, translateText, type MessageTree } from '../../../shared/i18n/translate'
import en from '../../../i18n/locales/en.json'
import es from '../../../i18n/locales/es.json'
import { parseProcedure } from '../../../shared/procedures'

// Server and zod messages are written in English and put into the reader's language at the
// boundary (server/plugins/error-language.ts, composables/error-text.ts) with the templates of
// each locale file's `errors` section.

const EN = en.errors as unknown as MessageTree
const ES = es.errors as unknown as MessageTree

describe('translateText', () => {
  it('rewrites a fixed message', () => {
    expect(translateText('Sign in first.', EN, ES)).toBe('Primero entra con tu cuenta.')
  })

  it('keeps the values of a template', () => {
    expect(translateText('This needs the owner or trainer role; you are signed in as trainee.', EN, ES))
      .toBe('Esto necesita el rol owner or trainer; has entrado como trainee.')
  })

  it('translates a label inside a message too', () => {
    expect(translateText('Step title is required.', EN, ES)).toBe('Título del paso: campo obligatorio.')
  })

  it('translates a reason inside a reason', () => {
    expect(translateText('The reason is too short: write at least 8 characters saying why.', EN, ES))
      .toBe('El motivo: es demasiado corto; escribe al menos 8 caracteres diciendo por qué.')
  })

  it('keeps a field path in front of a message', () => {
    expect(translateText('steps.3.title: Step title is required.', EN, ES)).toBe('steps.3.title: Título del paso: campo obligatorio.')
  })

  it('translates zod\'s own English', () => {
    expect(translateText('Invalid input: expected number, received string', EN, ES)).toBe('Dato no válido: se esperaba number y llegó string')
  })

  it('translates a Ledger summary with its optional tails', async () => {
    const { ledgerSummary } = await import('../../../shared/schemas/ledger')
    expect(translateText(ledgerSummary('hold-acknowledged', { signalWord: 'WARNING', lang: 'es' }), EN, ES))
      .toBe('Confirmó la parada de ADVERTENCIA. Texto en pantalla: es.')
    expect(translateText(ledgerSummary('hold-acknowledged', { signalWord: 'NOTICE' }), EN, ES)).toBe('Confirmó la parada de AVISO.')
    expect(translateText(ledgerSummary('signed-off', { stepTitle: 'Sign off', signerRole: 'trainer', lang: 'es', notCounted: 'Undone by the person who made it.' }), EN, ES))
      .toBe('Firmó «Sign off» como formador. Texto en pantalla: es. No cuenta: Undone by the person who made it.')
  })

  it('leaves a message nobody translated as it is', () => {
    expect(translateText('Something nobody wrote a template for.', EN, ES)).toBe('Something nobody wrote a template for.')
    expect(matchTemplate('Something nobody wrote a template for.', EN)).toBeUndefined()
  })

  it('changes nothing for English readers', () => {
    expect(translateText('Sign in first.', EN, EN)).toBe('Sign in first.')
  })

  it('translates the issues of a real schema and keeps their paths', () => {
    const result = parseProcedure({ title: 'Ok title', summary: 'A summary long enough.', category: 'daily', steps: [{ key: 'a', kind: 'instruction', title: '', body: 'Do it.' }] })
    expect(result.ok).toBe(false)
    if (result.ok) return
    const out = translateIssues(result.issues, EN, ES)
    expect(out.map(i => i.path)).toEqual(result.issues.map(i => i.path))
    expect(out.find(i => i.path === 'steps.0.title')?.message).toBe('Título del paso: necesita al menos 3 caracteres.')
  })
})

describe('pickLanguage (Accept-Language, RFC 9110 §12.5.4)', () => {
  const supported = ['en', 'es']
  it('takes the first supported language by weight', () => {
    expect(pickLanguage('es-MX,es;q=0.9,en;q=0.8', supported)).toBe('es')
    expect(pickLanguage('fr-CA,fr;q=0.9,en;q=0.5,es;q=0.7', supported)).toBe('es')
  })
  it('falls back to English for none, a wildcard or an unknown language', () => {
    expect(pickLanguage(undefined, supported)).toBe('en')
    expect(pickLanguage('*', supported)).toBe('en')
    expect(pickLanguage('de-DE', supported)).toBe('en')
  })
  it('ignores a language refused with q=0', () => {
    expect(pickLanguage('es;q=0, en', supported)).toBe('en')
  })
})
