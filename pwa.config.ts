import type { ModuleOptions } from '@vite-pwa/nuxt'

// Service worker and manifest. The offline behaviour (navigation fallback, API read caching,
// queue replay) is described in DEVELOPERS.md.
export const pwa: Partial<ModuleOptions> = {
  registerType: 'prompt',
  scope: '/',
  base: '/',
  injectRegister: false,
  manifest: {
    id: '/',
    name: 'Jogwise',
    short_name: 'Jogwise',
    description: 'Machine-side procedures and safety holds for a CNC-router shop',
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
    globPatterns: ['**/*.{js,css,html,woff2,png,svg,ico,webmanifest}'],
    cleanupOutdatedCaches: true,
    navigateFallback: null,
  },
  client: { installPrompt: false, periodicSyncForUpdates: 3600 },
  devOptions: { enabled: false },
}
