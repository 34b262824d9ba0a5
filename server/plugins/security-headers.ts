import { createHash } from 'node:crypto'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import type { H3Event } from 'h3'

// Security headers on every answer, pages and API alike. The Content-Security-Policy allows no
// inline script except the exact ones Nuxt wrote into this page: their sha256 hashes are taken
// from the HTML itself just before it leaves. That is done in `beforeResponse` rather than
// Nuxt's `render:response`, because the prerendered app shell (/shell, served as a static file
// and kept by the service worker for offline use) never passes through the renderer.
// Styles keep 'unsafe-inline': Vue writes style attributes (heat map, progress bars), and an
// injected style cannot run code.
const POLICY: Record<string, string[]> = {
  'default-src': ['\'self\''],
  'script-src': ['\'self\''],
  'style-src': ['\'self\'', '\'unsafe-inline\''],
  // blob: for photos the camera just took, data: for small images inlined by the build
  'img-src': ['\'self\'', 'blob:', 'data:'],
  'font-src': ['\'self\'', 'data:'],
  'media-src': ['\'self\'', 'blob:'],
  'connect-src': ['\'self\''],
  'worker-src': ['\'self\''],
  'manifest-src': ['\'self\''],
  'object-src': ['\'none\''],
  'base-uri': ['\'self\''],
  'form-action': ['\'self\''],
  'frame-ancestors': ['\'none\''],
}

export function contentSecurityPolicy(scriptHashes: string[] = []) {
  return Object.entries(POLICY)
    .map(([name, values]) => [name, ...values, ...(name === 'script-src' ? scriptHashes.map(h => `'sha256-${h}'`) : [])].join(' '))
    .join('; ')
}

const STATIC_HEADERS = {
  'X-Content-Type-Options': 'nosniff',
  'X-Frame-Options': 'DENY',
  'Referrer-Policy': 'strict-origin-when-cross-origin',
  // The camera is used for photo evidence on our own pages only; nothing else is needed.
  'Permissions-Policy': 'camera=(self), microphone=(), geolocation=(), payment=(), usb=()',
  'Cross-Origin-Opener-Policy': 'same-origin',
}

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
  return [...hashes]
}

function htmlOf(event: H3Event, body: unknown): string | undefined {
  const type = String(getResponseHeader(event, 'content-type') ?? '')
  if (!type.includes('text/html')) return undefined
  if (typeof body === 'string') return body
  if (!(body instanceof Uint8Array)) return undefined
  // A prerendered page may be sent precompressed (nitro compressPublicAssets).
  const encoding = String(getResponseHeader(event, 'content-encoding') ?? '')
  const bytes = Buffer.from(body)
  if (encoding === 'br') return brotliDecompressSync(bytes).toString('utf8')
  if (encoding === 'gzip') return gunzipSync(bytes).toString('utf8')
  return encoding ? undefined : bytes.toString('utf8')
}

export default defineNitroPlugin((nitroApp) => {
  // The dev server's injected scripts change all the time; the policy is for built servers.
  if (import.meta.dev) return

  nitroApp.hooks.hook('request', (event) => {
    setResponseHeaders(event, { ...STATIC_HEADERS, 'Content-Security-Policy': contentSecurityPolicy() })
  })

  nitroApp.hooks.hook('beforeResponse', (event, response) => {
    // A 304's headers replace the cached page's, whose policy holds that page's hashes.
    if (getResponseStatus(event) === 304) {
      removeResponseHeader(event, 'Content-Security-Policy')
      return
    }
    const html = htmlOf(event, response?.body)
    if (html === undefined) return
    setResponseHeader(event, 'Content-Security-Policy', contentSecurityPolicy(inlineScriptHashes(html)))
  })
})
