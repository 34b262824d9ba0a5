import { languages } from '#jogwise-languages'

// Picks the language a screen starts in and loads its messages (and English, which fills in
// what a language lacks) before anything renders, so the server's page and the browser's first
// render read the same. The server decides from the request; the browser takes that choice from
// the page, or decides itself where no server rendered (the offline shell).
export default defineNuxtPlugin({
  name: 'jogwise-i18n',
  async setup() {
    const { locale } = useI18n()
    // A signed-in person's own choice first (plugins/user-language.ts keeps it once running).
    const chosen = useUserSession().user.value?.language
    if (import.meta.server) {
      const headers = useRequestHeaders(['cookie', 'accept-language'])
      locale.value = startingLanguage(chosen, headers.cookie, headers['accept-language'])
    }
    else if (!useNuxtApp().payload.serverRendered) {
      locale.value = startingLanguage(chosen, document.cookie, navigator.languages.join(','))
    }
    const code = locale.value
    if (import.meta.server) {
      // The browser fetches the same files as soon as it reads the page's head.
      const files = languages.filter(l => l.code === 'en' || l.code === code).map(l => l.file)
      useHead({ link: files.map(href => ({ rel: 'preload', as: 'fetch', href, crossorigin: 'anonymous' })) })
    }
    try {
      await Promise.all([loadLanguage('en'), loadLanguage(code)])
    }
    catch (error) {
      // Not reachable and not in the service worker's cache: the screen shows keys rather than
      // nothing, and the next screen tries again.
      console.error('Jogwise: the language files could not be loaded', error)
    }
  },
})
