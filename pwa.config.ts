import type { ModuleOptions } from '@vite-pwa/nuxt'

// The service worker that keeps Jogwise working when the shop Wi-Fi drops.
// - Precache: only build output (js, css, fonts, icons) plus the app shell page `/shell`, a
//   client-rendered copy of the app that boots from cached data and the remembered session.
// - Navigations: network first (fresh server-rendered pages online); when the network fails
//   the shell is served, so a hard reload of any screen — the Run screen too — opens offline.
// - GET /api/ reads: network first with a short timeout, then the cached copy (its Date header
//   tells the screen how old it is). Sign-in, session and sync routes are never cached.
export const API_CACHE = 'jogwise-api'

export const pwa: Partial<ModuleOptions> = {
  registerType: 'prompt',
  scope: '/',
  base: '/',
  manifest: {
    id: '/',
    name: 'Jogwise',
    short_name: 'Jogwise',
    description: 'Machine-side procedures and safety holds for a CNC-router shop',
    start_url: '/',
    theme_color: '#14201c',
    background_color: '#14201c',
    display: 'standalone',
    orientation: 'any',
    icons: [
      { src: '/icons/jogwise-192.png', sizes: '192x192', type: 'image/png' },
      { src: '/icons/jogwise-512.png', sizes: '512x512', type: 'image/png' },
      { src: '/icons/jogwise-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
    ],
  },
  workbox: {
    // The language files (/_lang/<code>.<hash>.json, modules/languages.ts)
    // are precached with the screens, so a screen reloads offline in its person's language.
    // woff: the fonts the printed sheet embeds; wasm: the QR reader of "Scan a machine tag" where
    // the browser has no BarcodeDetector (issue 17).
    globPatterns: ['**/*.{js,css,woff,woff2,wasm,png,svg,ico,webmanifest}', 'shell/index.html', '_lang/*.json'],
    // The QR reader's WASM is about 1.1 MB; workbox skips files over 2 MB by default.
    maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
    cleanupOutdatedCaches: true,
    // The first install takes over open pages at once; later versions wait for the prompt.
    clientsClaim: true,
    navigateFallback: null,
    runtimeCaching: [
      {
        urlPattern: ({ request, url }) => request.mode === 'navigate' && !url.pathname.startsWith('/api/'),
        handler: 'NetworkFirst',
        options: {
          cacheName: 'jogwise-pages',
          networkTimeoutSeconds: 4,
          precacheFallback: { fallbackURL: '/shell' },
          cacheableResponse: { statuses: [200] },
          expiration: { maxEntries: 1, purgeOnQuotaError: true },
        },
      },
      {
        urlPattern: ({ url, request, sameOrigin }) => sameOrigin && request.method === 'GET' && url.pathname.startsWith('/api/')
          && !url.pathname.startsWith('/api/_auth/') && !url.pathname.startsWith('/api/auth/'),
        handler: 'NetworkFirst',
        method: 'GET',
        options: {
          cacheName: 'jogwise-api',
          networkTimeoutSeconds: 3,
          cacheableResponse: { statuses: [200] },
          expiration: { maxEntries: 300, maxAgeSeconds: 60 * 60 * 24 * 14, purgeOnQuotaError: true },
        },
      },
    ],
  },
  // The module's client plugin is off: plugins/app-update.client.ts registers the worker, checks
  // hourly for a new version and offers it, with no service-worker library on every screen (issue 14).
  client: { registerPlugin: false },
  devOptions: { enabled: !!process.env.JOGWISE_DEV_PWA, type: 'module' },
}
