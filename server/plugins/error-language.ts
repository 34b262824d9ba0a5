import type { FieldIssue } from '#shared/i18n/translate'

// Errors are written in English where they are raised (routes, zod schemas). Just before Nitro
// turns one into the answer, its message and each field issue's message are put into the
// caller's language (server/utils/language.ts); the issues' paths stay as they are. Nitro calls
// `error` hooks synchronously ahead of its error handler (see database-unavailable.ts).
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error: any, context) => {
    if (!context.event || !error || typeof error !== 'object') return
    const lang = callerLanguage(context.event)
    if (lang === 'en') return
    if (typeof error.message === 'string') error.message = textIn(lang, error.message)
    const issues = error.data?.issues as FieldIssue[] | undefined
    if (Array.isArray(issues)) error.data = { ...error.data, issues: issuesIn(lang, issues) }
  })
})
