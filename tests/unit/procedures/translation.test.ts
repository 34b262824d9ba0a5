import { describe, expect, it } from 'vitest'
import {
  carryTranslations, localizeStep, localizedTitle, storedTitlesIn, parseProcedure, readTranslations, STARTER_LIBRARY, STARTER_TRANSLATIONS,
  stepTexts, VersionTranslationSchema, type Procedure, type Translations,
} from '../../../shared/procedures'

// A procedure version's translations (issue 16): each step shown in the reader's language,
// the original where nobody translated it yet, and translations carried to the next version
// as drafts for the steps that did not change.

const starter = (slug: string) => {
  const parsed = parseProcedure(STARTER_LIBRARY.find(p => p.slug === slug))
  if (!parsed.ok) throw new Error('starter procedure does not parse')
  return parsed.procedure
}

describe('localizeStep', () => {
  const procedure = starter('spoilboard-resurfacing')
  const tr = STARTER_TRANSLATIONS['spoilboard-resurfacing']!
  const hold = procedure.steps.find(s => s.key === 'isolate-power')!

  it('shows a translated hold in Spanish, keeping its signal word and key', () => {
    const out = localizeStep(hold, tr, 'es')
    expect(out.coverage).toBe('full')
    expect(out.lang).toBe('es')
    expect(out.step.key).toBe('isolate-power')
    expect(out.step.kind === 'hold' && out.step.signalWord).toBe('WARNING')
    expect(out.step.title).toBe('Corta la corriente antes de desenchufar nada')
    expect(out.step.kind === 'hold' && out.step.hazard).toMatch(/descarga eléctrica/)
  })

  it('shows the original, marked untranslated, where no translation exists', () => {
    const out = localizeStep(hold, {}, 'es')
    expect(out).toMatchObject({ coverage: 'none', lang: 'en' })
    expect(out.step).toBe(hold)
  })

  it('fills a partly translated step from the original and says so', () => {
    const out = localizeStep(hold, { es: { steps: { 'isolate-power': { title: 'Corta la corriente' } } } }, 'es')
    expect(out.coverage).toBe('partial')
    expect(out.step.title).toBe('Corta la corriente')
    expect(out.step.body).toBe(hold.body)
  })

  it('leaves English readers the original', () => {
    expect(localizeStep(hold, tr, 'en').step).toBe(hold)
    expect(localizedTitle({ title: 'Resurface the spoilboard', translations: tr }, 'es')).toBe('Planear la tabla de sacrificio')
  })

  it('names procedures and steps from translations as stored, the original where one is missing or unreadable', () => {
    // A stored column as the database returns it: JSON, possibly written by an older version
    const stored = JSON.parse(JSON.stringify({ es: { title: 'Planear la tabla', steps: { 'isolate-power': { title: 'Corta la corriente' } } } }))
    const es = storedTitlesIn(stored, 'es')
    expect(es.procedure('Resurface the spoilboard')).toBe('Planear la tabla')
    expect(es.step('isolate-power', 'Isolate the power')).toBe('Corta la corriente')
    expect(es.step('no-such-step', 'Clean up')).toBe('Clean up')
    expect(storedTitlesIn(stored, 'en').procedure('Resurface the spoilboard')).toBe('Resurface the spoilboard')
    for (const broken of [null, 'not json', { es: 'not an object' }, { es: { title: 7 } }]) {
      expect(storedTitlesIn(broken, 'es').procedure('Resurface the spoilboard'), JSON.stringify(broken)).toBe('Resurface the spoilboard')
    }
  })
})

describe('the starter library in Spanish', () => {
  const es = STARTER_TRANSLATIONS['spoilboard-resurfacing']!.es!

  it('passes its own schema', () => {
    for (const [slug, t] of Object.entries(STARTER_TRANSLATIONS)) expect(VersionTranslationSchema.safeParse(t.es).success, slug).toBe(true)
  })

  it('translates every text of every step of each translated procedure, and no step that does not exist', () => {
    // The whole starter library comes in Spanish.
    expect(Object.keys(STARTER_TRANSLATIONS).sort()).toEqual(STARTER_LIBRARY.map(p => p.slug).sort())
    for (const [slug, translations] of Object.entries(STARTER_TRANSLATIONS)) {
      const p = starter(slug)
      const spanish = translations.es!
      expect(spanish.title, slug).toBeTruthy()
      expect(spanish.summary, slug).toBeTruthy()
      const missing = p.steps.flatMap(step => Object.keys(stepTexts(step))
        .filter(f => !(spanish.steps[step.key] as Record<string, unknown> | undefined)?.[f]).map(f => `${step.key}.${f}`))
      expect(missing, slug).toEqual([])
      expect(Object.keys(spanish.steps).filter(k => !p.steps.some(s => s.key === k)), slug).toEqual([])
    }
  })

  it('keeps the numbers of the English text, written with the decimal comma', () => {
    // The paper-feeler steps and the repeat pass name the same jog steps and depths.
    expect(es.steps['z-zero']!.body).toContain('0,01 mm')
    expect(es.steps['repeat-pass']!.body).toContain('0,1 y 0,2 mm')
  })
})

describe('carryTranslations', () => {
  const before: Procedure = starter('spoilboard-resurfacing')
  const translations: Translations = STARTER_TRANSLATIONS['spoilboard-resurfacing']!

  it('keeps unchanged steps as drafts and drops changed ones', () => {
    const after = { ...before, steps: before.steps.map(s => s.key === 'clear-bed' ? { ...s, body: `${s.body} Check under the gantry too.` } : s) }
    const carried = carryTranslations({ ...before, translations }, after)
    expect(carried.es!.steps['clear-bed']).toBeUndefined()
    expect(carried.es!.steps['isolate-power']).toMatchObject({ draft: true, title: translations.es!.steps['isolate-power']!.title })
    expect(carried.es!.title).toBe(translations.es!.title)
  })

  it('drops the title when the title changed, and steps whose kind changed', () => {
    const after = { ...before, title: 'Face the spoilboard', steps: before.steps.map(s => s.key === 'home' ? { ...s, kind: 'photo' as const, subject: 'The homed machine.' } : s) }
    const carried = carryTranslations({ ...before, translations }, after)
    expect(carried.es!.title).toBeUndefined()
    expect(carried.es!.steps.home).toBeUndefined()
  })
})

describe('readTranslations', () => {
  it('leaves out a stored language that no longer passes, keeping the others', () => {
    const out = readTranslations({ 'es': { steps: { a: { title: 'Hola' } } }, 'fr': { steps: { a: { title: 42 } } }, 'not a code': {} })
    expect(Object.keys(out)).toEqual(['es'])
    expect(readTranslations(null)).toEqual({})
  })
})
