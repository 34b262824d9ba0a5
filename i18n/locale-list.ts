import { readdirSync, readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'

// The app's languages are the files in i18n/locales: a third language is one more JSON file
// (its `meta` names it), read here at build time for both the Nuxt i18n module and the server.
export const LOCALES_DIR = fileURLToPath(new URL('./locales', import.meta.url))

// A type, not an interface: the i18n module's LocaleObject has an index signature.
export type LocaleFile = { code: string, file: string, language: string, name: string }

export function localeFiles(): LocaleFile[] {
  return readdirSync(LOCALES_DIR).filter(f => f.endsWith('.json')).sort().map((file) => {
    const meta = JSON.parse(readFileSync(`${LOCALES_DIR}/${file}`, 'utf8')).meta ?? {}
    const code = file.replace(/\.json$/, '')
    return { code, file, language: meta.tag ?? code, name: meta.name ?? code }
  })
}

/** Source of the server's virtual module `#jogwise-locales`: every locale's messages by code. */
export function localesModule() {
  const all = Object.fromEntries(localeFiles().map(l => [l.code, JSON.parse(readFileSync(`${LOCALES_DIR}/${l.file}`, 'utf8'))]))
  return `export default ${JSON.stringify(all)}`
}
