import { fileURLToPath } from 'node:url'
import { pwa } from './pwa.config'
import { cspHashesModule } from './server/build/csp-hashes'
import { localesModule } from './i18n/locale-list'

// Jogwise keeps Nuxt's folders at the repository root (app.vue, pages/, components/…), so srcDir
// is '.'; server/, shared/ and public/ are Nuxt's defaults relative to it.
export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  // A separate output folder (the test suite's) gets its own build folder too, so two builds
  // at once never share intermediate files.
  ...(process.env.JOGWISE_OUTPUT_DIR && { buildDir: `${process.env.JOGWISE_OUTPUT_DIR}-build` }),
  modules: [
    '@pinia/nuxt',
    '@nuxtjs/tailwindcss',
    'nuxt-auth-utils',
    '@vueuse/nuxt',
    '@vite-pwa/nuxt',
    '@nuxt/eslint',
  ],
  // Languages: every file in i18n/locales is one (modules/languages.ts serves them as data);
  // the screens read them through composables/i18n.ts. No URL prefix: the tablet keeps the same
  // addresses. Until a person chooses a language (their profile, plugins/user-language.ts) the
  // tablet's last choice or the browser's language decides (plugins/i18n.ts).
  // npm run lint: the project's code style (single quotes, no semicolons), eslint.config.mjs.
  eslint: { config: { stylistic: { quotes: 'single', semi: false, indent: 2, commaDangle: 'always-multiline', braceStyle: 'stroustrup', arrowParens: false } } },
  css: ['~/assets/css/main.css'],
  devtools: { enabled: false },
  // npm run typecheck also checks the TypeScript programs the shell scripts run.
  typescript: { nodeTsConfig: { include: ['../scripts/**/*.ts'] } },
  telemetry: false,
  imports: { dirs: ['stores'] },
  // Folder names group components; the file name alone is the tag (<MachineTile>, <TheTopBar>).
  components: [{ path: '~/components', pathPrefix: false }],
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Jogwise',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'description', content: 'Machine-side procedures, safety holds and machining arithmetic for a CNC-router shop.' },
      ],
      script: [
        // Zod 4 probes once whether `new Function` works, to compile faster parsers; the
        // Content-Security-Policy allows no eval, so the probe is refused and reported as a
        // violation. Zod's own `jitless` setting skips it; it must be set before any schema is
        // built, so it goes into zod's global config object ahead of the app's modules.
        { innerHTML: 'globalThis.__zod_globalConfig=Object.assign(globalThis.__zod_globalConfig||{},{jitless:true})' },
      ],
      link: [
        { rel: 'icon', type: 'image/png', href: '/icons/jogwise-192.png' },
        { rel: 'apple-touch-icon', href: '/icons/apple-touch-icon-180.png' },
      ],
    },
  },
  // Every key is empty here and filled from NUXT_* variables (see .env.example).
  runtimeConfig: {
    /** socket: MariaDB's Unix socket when it runs on this machine (cheaper than loopback TCP); empty means host and port. */
    db: { host: '127.0.0.1', port: '3417', user: 'jogwise', password: '', name: 'jogwise', socket: '' },
    /** Seed the invented demo shop when the database holds no shop yet. */
    demoSeed: '',
    /** Demo password printed by npm start; used only by the seed. */
    demoPassword: '',
    /** Folder for photo evidence on local disk; empty means <cwd>/.data/uploads. */
    uploadsDir: '',
    /** Where photos go: local (empty, the default) or s3. */
    storageDriver: '',
    /** The S3-compatible bucket for the s3 driver; see .env.example. */
    s3: { endpoint: '', region: '', bucket: '', accessKeyId: '', secretAccessKey: '', forcePathStyle: '' },
    /** Outgoing e-mail over SMTP, the outbox worker and the daily digest; see .env.example. */
    mail: {
      smtpHost: '', smtpPort: '', smtpSecure: '', smtpUser: '', smtpPass: '', from: '',
      /** REST API of the local fake SMTP server, set only when it is in use (caught-mail page). */
      fakeApiUrl: '',
      workerIntervalMs: '', retryBaseMs: '', retryCapMs: '', digestHour: '', inviteTtlHours: '',
    },
    /** The address people open Jogwise at, for links in e-mails (empty = http://localhost:PORT). */
    siteUrl: '',
    /**
     * Set to 1 only behind a reverse proxy of your own: then its X-Forwarded-For and
     * X-Forwarded-Proto count for sign-in throttling and the Secure cookie flag.
     */
    trustProxy: '',
    session: {
      password: '',
      maxAge: 60 * 60 * 12,
      // Lax, not Strict: a link from an override e-mail must open the page signed in. Secure is
      // h3's default; server/plugins/session-cookie.ts drops it for plain-http answers only.
      cookie: { sameSite: 'lax', httpOnly: true, secure: true },
    },
  },
  // The app shell: a client-rendered page the service worker serves for any screen opened
  // without a network (see pwa.config.ts).
  routeRules: {
    '/shell': { ssr: false, prerender: true },
  },
  // Payload files are fetched separately and fail offline (vitesse nuxt.config.ts note).
  // Links prefetch their page's scripts on touch or focus, not as soon as they are on screen:
  // the rail's links would otherwise load every screen's code (charts, planner, editor) beside
  // the Run screen (issue 14). Offline, the service worker's precache has them all anyway.
  // No app manifest: it serves only client-side route rules (Jogwise has none the browser needs)
  // and a check for a newer build, which the service worker's update prompt makes already.
  experimental: { appManifest: false, payloadExtraction: false, defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } } },
  // Production only: Nitro's node server plus JSON answers for requests Node refuses itself
  // (server/entry/node-server.ts); `nuxt dev` keeps its own entry.
  $production: {
    nitro: {
      entry: fileURLToPath(new URL('./server/entry/node-server.ts', import.meta.url)),
      // The prerenderer (/shell) is built from the same config; it keeps its own entry.
      hooks: { 'prerender:config': (config) => { delete config.entry } },
    },
  },
  nitro: {
    hooks: {
      // The prerendered shell exists by the time the server itself is bundled.
      'build:before': (nitro) => {
        nitro.options.virtual['#jogwise-csp-hashes'] = () => cspHashesModule(nitro.options.output.publicDir)
        // Server errors and e-mails in the caller's language (server/utils/language.ts).
        nitro.options.virtual['#jogwise-locales'] = () => localesModule()
      },
    },
    compressPublicAssets: true,
    prerender: { routes: ['/shell'], crawlLinks: false },
    // The service worker and manifest must never be served stale (elk modules/pwa).
    routeRules: {
      '/sw.js': { headers: { 'cache-control': 'public, max-age=0, must-revalidate' } },
      '/manifest.webmanifest': { headers: { 'cache-control': 'public, max-age=0, must-revalidate' } },
    },
    // The test suite builds into its own folder so a running `npm start` server is untouched.
    ...(process.env.JOGWISE_OUTPUT_DIR && { output: { dir: process.env.JOGWISE_OUTPUT_DIR } }),
  },
  // JOGWISE_CLIENT_SOURCEMAP=1: hidden client source maps (the scripts are byte for byte the
  // same), to see which source modules each script's weight comes from (bench/weight-sources.ts).
  ...(process.env.JOGWISE_CLIENT_SOURCEMAP && { sourcemap: { client: 'hidden' as const } }),
  pwa,
  tailwindcss: { cssPath: false, viewer: false },
})
