import { z } from 'zod'

import { LANGUAGE_CODE, LANGUAGE_CODE_MESSAGE } from '../rules/language'

export { LANGUAGE_CODE }

export const LanguageCodeSchema = z.string({ error: 'Language must be text.' })
  .regex(LANGUAGE_CODE, LANGUAGE_CODE_MESSAGE)

/** PATCH /api/me: the signed-in person's own language; null hands the choice back to the browser. */
export const MePatchSchema = z.object({
  language: LanguageCodeSchema.nullable(),
}, { error: 'Send an object with a language.' })
