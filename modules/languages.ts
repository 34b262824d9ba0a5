import { createHash } from 'node:crypto'
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { addTemplate, addTypeTemplate, defineNuxtModule } from '@nuxt/kit'
import { LOCALES_DIR, localeFiles } from '../i18n/locale-list'

// The screens' languages (issue 14: a lighter Run screen than a full i18n library gives). Each
// file in i18n/locales is served as /_lang/<code>.<content hash>.json: data, not script, fetched
// once and cached for good, and precached by the service worker so a screen reloads offline in
// its person's language (pwa.config.ts). `#jogwise-languages` tells the app which files exist.

export interface LanguageEntry { code: string, name: string, language: string, file: string }

export default defineNuxtModule({
  meta: { name: 'jogwise-languages' },
  setup(_options, nuxt) {
    const outDir = join(nuxt.options.buildDir, 'jogwise-languages')
    const files = localeFiles().map((l) => {
      const text = JSON.stringify(JSON.parse(readFileSync(join(LOCALES_DIR, l.file), 'utf8')))
      const hash = createHash('sha256').update(text).digest('hex').slice(0, 10)
      return { ...l, text, fileName: `${l.code}.${hash}.json` }
    })
    const entries: LanguageEntry[] = files.map(l => ({ code: l.code, name: l.name, language: l.language, file: `/_lang/${l.fileName}` }))
    // Written once the build folder has been cleared for this build (`nuxt build` clears it
    // after the modules are set up), before Nitro copies its public assets.
    nuxt.hook('build:before', () => {
      rmSync(outDir, { recursive: true, force: true })
      mkdirSync(outDir, { recursive: true })
      for (const f of files) writeFileSync(join(outDir, f.fileName), f.text)
    })
    // English first: it fills in any key another language lacks.
    entries.sort((a, b) => a.code === 'en' ? -1 : b.code === 'en' ? 1 : a.code.localeCompare(b.code))

    nuxt.options.nitro.publicAssets ||= []
    nuxt.options.nitro.publicAssets.push({ dir: outDir, baseURL: '/_lang', maxAge: 60 * 60 * 24 * 365 })

    const template = addTemplate({ filename: 'jogwise-languages.mjs', getContents: () => `export const languages = ${JSON.stringify(entries)}\n` })
    nuxt.options.alias['#jogwise-languages'] = template.dst
    addTypeTemplate({
      filename: 'types/jogwise-languages.d.ts',
      getContents: () => [
        'declare module \'#jogwise-languages\' {',
        '  export const languages: { code: string, name: string, language: string, file: string }[]',
        '}',
        '',
      ].join('\n'),
    })
  },
})
