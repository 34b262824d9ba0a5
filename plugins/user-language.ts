// The screens follow the language of the person the tablet is signed in as: their profile's
// choice once they made one, the browser's until then (the i18n module's detection). A trainer
// signing a trainee's run does not sign the tablet in, so the trainee's language stays.
export default defineNuxtPlugin({
  name: 'jogwise-user-language',
  dependsOn: ['i18n:plugin'],
  async setup() {
    const { user } = useUserSession()
    const i18n = useNuxtApp().$i18n
    async function apply(lang: string | null | undefined) {
      if (!lang || lang === i18n.locale.value || !i18n.localeCodes.value.includes(lang as never)) return
      await i18n.setLocale(lang as never)
    }
    await apply(user.value?.language)
    watch(() => user.value?.language, lang => apply(lang))
  },
})
