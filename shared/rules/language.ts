// A language is named by its locale file (i18n/locales/<code>.json): a short lower-case code.
// Which codes exist is the server's to say (server/utils/language.ts); shared code checks form.
// Kept free of zod so the Run screen's zod/mini event schemas can use it too.
export const LANGUAGE_CODE = /^[a-z]{2,3}$/
export const LANGUAGE_CODE_MESSAGE = 'Language must be a two- or three-letter code such as "es".'
