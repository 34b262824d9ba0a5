import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { flatten, type MessageTree } from '../../../shared/i18n/translate'

// Every language file (i18n/locales) has every key the English file has, and nothing the
// English lacks: a screen in any language never falls back to a bare key or to English. The
// keys the code asks for with a literal t('…') exist too.

const DIR = join(import.meta.dirname, '../../../i18n/locales')
const files = readdirSync(DIR).filter(f => f.endsWith('.json')).sort()
const load = (f: string) => JSON.parse(readFileSync(join(DIR, f), 'utf8')) as MessageTree
const english = flatten(load('en.json'))
// `{name}` placeholders of a message, to compare across languages.
const placeholders = (text: string) => [...text.matchAll(/\{(\w+)\}/g)].map(m => m[1]).sort()

describe('locale files', () => {
  it('has English and Spanish to start', () => {
    expect(files).toEqual(expect.arrayContaining(['en.json', 'es.json']))
  })

  for (const file of files.filter(f => f !== 'en.json')) {
    describe(file, () => {
      const other = flatten(load(file))
      it('has every key of the English file', () => {
        expect(Object.keys(english).filter(k => !(k in other))).toEqual([])
      })
      it('has no key the English file lacks', () => {
        expect(Object.keys(other).filter(k => !(k in english))).toEqual([])
      })
      it('keeps every placeholder of each English message', () => {
        const differing = Object.keys(english).filter(k => k in other && placeholders(english[k]!).join() !== placeholders(other[k]!).join())
        expect(differing).toEqual([])
      })
      it('has the same number of plural forms as English', () => {
        const forms = (t: string) => t.split(' | ').length
        expect(Object.keys(english).filter(k => k in other && forms(english[k]!) !== forms(other[k]!))).toEqual([])
      })
      it('translates one English error template one way only', () => {
        // Errors are matched by their English text (shared/i18n/translate.ts): two templates with
        // the same English and different translations would make the choice between them chance.
        const byText = new Map<string, Set<string>>()
        for (const [k, text] of Object.entries(english)) {
          if (!k.startsWith('errors.') || !(k in other)) continue
          byText.set(text, (byText.get(text) ?? new Set()).add(other[k]!))
        }
        expect([...byText].filter(([, ways]) => ways.size > 1).map(([text]) => text)).toEqual([])
      })
      it('names itself and its Intl tag', () => {
        expect(other['meta.name']).toBeTruthy()
        expect(() => new Intl.NumberFormat(other['meta.tag'])).not.toThrow()
      })
    })
  }

  it('has no empty message and no character the message compiler treats as syntax by mistake', () => {
    for (const file of files) {
      const messages = flatten(load(file))
      for (const [key, text] of Object.entries(messages)) {
        expect(text.trim(), `${file} ${key}`).not.toBe('')
        // "@" starts a linked message in vue-i18n; "{" must open a placeholder.
        expect(text, `${file} ${key}`).not.toMatch(/@|\{(?!\w+\})/)
      }
    }
  })
})

describe('keys the code uses', () => {
  const ROOTS = ['components', 'pages', 'composables', 'layouts', 'plugins', 'app.vue', 'error.vue']
  const sources: string[] = []
  const walk = (path: string) => {
    if (/\.(vue|ts)$/.test(path)) {
      sources.push(readFileSync(path, 'utf8'))
      return
    }
    let names: string[] = []
    try { names = readdirSync(path) }
    catch { return }
    for (const name of names) walk(join(path, name))
  }
  for (const r of ROOTS) walk(join(import.meta.dirname, '../../..', r))

  it('finds the screens', () => {
    expect(sources.length).toBeGreaterThan(50)
  })

  it('asks only for keys the English file has', () => {
    const used = new Set<string>()
    for (const s of sources) {
      for (const m of s.matchAll(/\b(?:t|te)\(\s*'([\w.-]+)'/g)) used.add(m[1]!)
      for (const m of s.matchAll(/keypath="'?([\w.-]+)'?"/g)) if (m[1]!.includes('.')) used.add(m[1]!)
    }
    expect(used.size).toBeGreaterThan(100)
    expect([...used].filter(k => !(k in english)).sort()).toEqual([])
  })
})
