// The server's virtual module of every locale file's messages by code, compiled in by
// nuxt.config.ts from i18n/locale-list.ts (server errors and e-mails in the reader's language).
// Declared here, not beside the CSP module, because app code type-checks server utils too.
declare module '#jogwise-locales' {
  const locales: Record<string, Record<string, unknown>>
  export default locales
}
