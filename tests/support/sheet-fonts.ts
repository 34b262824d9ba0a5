import { readFile } from 'node:fs/promises'
import { createRequire } from 'node:module'

// The app's own fonts, the same WOFF files the browser loads (composables/paper-sheet.ts), from the
// installed @fontsource package.
const require = createRequire(import.meta.url)
const file = (weight: 400 | 700) => require.resolve(`@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-${weight}-normal.woff`)

export async function sheetFonts() {
  return { regular: new Uint8Array(await readFile(file(400))), bold: new Uint8Array(await readFile(file(700))) }
}
