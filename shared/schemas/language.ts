import { z } from 'zod'

// A language is named by its locale file (i18n/locales/<code>.json): a short lower-case code.
// Which codes exist is the server's to say (server/utils/language.ts); shared code checks form.
export const LANGUAGE_CODE = /^[a-z]{2,3}$/

export const LanguageCodeSchema = z.string({ error: 'Language must be text.' })
  .regex(LANGUAGE_CODE, 'Language must be a two- or three-letter code such as "es".')

/** PATCH /api/me: the signed-in person's own language; null hands the choice back to the browser. */
export const MePatchSchema = z.object({
  language: LanguageCodeSchema.nullable(),
}, { error: 'Send an object with a language.' })
