import { createHash } from 'node:crypto'
import { existsSync, readFileSync } from 'node:fs'
import { join } from 'node:path'

// The inline scripts a Jogwise page may run are fixed by the build: the zod `jitless` head
// script (nuxt.config.ts) and Nuxt's runtime-config script. The prerendered app shell holds
// exactly these, so their hashes are taken from it while the server is built and compiled into
// it (virtual module #jogwise-csp-hashes). The policy never hashes what a page happens to
// contain as it is sent, so a script injected into a page is never allowed.

/** sha256 (base64) of every inline classic or module script; JSON data blocks never run. */
export function inlineScriptHashes(html: string) {
  const hashes = new Set<string>()
  for (const m of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script\s*>/gi)) {
    const attrs = m[1] ?? ''
    if (/\ssrc\s*=/i.test(attrs)) continue
    const type = attrs.match(/\stype\s*=\s*["']?([^"'\s>]+)/i)?.[1]?.toLowerCase()
    if (type && !['module', 'text/javascript', 'application/javascript'].includes(type)) continue
    hashes.add(createHash('sha256').update(m[2] ?? '', 'utf8').digest('base64'))
  }
  return [...hashes].sort()
}

/** The virtual module's source: the shell's inline-script hashes, or none before prerendering. */
export function cspHashesModule(publicDir: string) {
  const shell = join(publicDir, 'shell', 'index.html')
  const hashes = existsSync(shell) ? inlineScriptHashes(readFileSync(shell, 'utf8')) : []
  return `export default ${JSON.stringify(hashes)}`
}
