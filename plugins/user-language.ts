// The screens follow the language of the person the tablet is signed in as: their profile's
// choice once they made one, the tablet's or the browser's until then (plugins/i18n.ts). A trainer
// signing a trainee's run does not sign the tablet in, so the trainee's language stays.
export default defineNuxtPlugin({
  name: 'jogwise-user-language',
  dependsOn: ['jogwise-i18n'],
  async setup() {
    const { user } = useUserSession()
    const { locale, setLocale } = useI18n()
    async function apply(lang: string | null | undefined) {
      if (lang && lang !== locale.value) await setLocale(lang)
    }
    await apply(user.value?.language)
    watch(() => user.value?.language, lang => apply(lang))
  },
})
