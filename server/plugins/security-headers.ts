import buildScriptHashes from '#jogwise-csp-hashes'

// Security headers on every answer, pages and API alike. The Content-Security-Policy allows no
// inline script except the ones the build wrote: their sha256 hashes come from the prerendered
// shell at build time (server/build/csp-hashes.ts), never from the HTML being sent, so a script
// injected into a page does not run. The same policy covers SSR pages and the prerendered
// /shell (served as a static file and kept by the service worker for offline use).
// Styles keep 'unsafe-inline': Vue writes style attributes (heat map, progress bars), and an
// injected style cannot run code.
const POLICY: Record<string, string[]> = {
  'default-src': ['\'self\''],
  // 'wasm-unsafe-eval' lets WebAssembly compile (the QR reader of "Scan a machine tag", served
  // from our own origin, issue 17); it does not allow eval or new Function.
  'script-src': ['\'self\'', '\'wasm-unsafe-eval\''],
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

export default defineNitroPlugin((nitroApp) => {
  // The dev server's injected scripts change all the time; the policy is for built servers.
  if (import.meta.dev) return

  const policy = contentSecurityPolicy(buildScriptHashes)
  nitroApp.hooks.hook('request', (event) => {
    setResponseHeaders(event, { ...STATIC_HEADERS, 'Content-Security-Policy': policy })
    // Over HTTPS only: a shop serving plain http on its own network must not be locked out.
    // No includeSubDomains: other hosts of the shop's domain may not have certificates.
    if (requestIsHttps(event)) setResponseHeader(event, 'Strict-Transport-Security', 'max-age=31536000')
  })
})
