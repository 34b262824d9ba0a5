import { z } from 'zod'
import { MAX_ID } from './input'
import { ROLES } from '../types/roles'

const name = z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(120, 'Keep the name under 120 characters.')
const email = z.string({ error: 'Enter an e-mail address.' }).trim().toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }))
const role = z.enum(ROLES, { error: `Role must be one of: ${ROLES.join(', ')}.` })
const password = z.string({ error: 'Enter a password.' })
  .min(10, 'Use at least 10 characters for the password.')
  .max(200, 'Keep the password under 200 characters.')
const pin = z.string().regex(/^\d{4,8}$/, 'A PIN is 4 to 8 digits.')

export const UserCreateSchema = z.object({ name, email, role, password, pin: pin.optional() }).strict()
export type UserCreateInput = z.infer<typeof UserCreateSchema>

export const UserPatchSchema = z.object({
  name: name.optional(),
  role: role.optional(),
  active: z.boolean({ error: 'Active must be true or false.' }).optional(),
  pin: pin.nullable().optional(),
}).strict().refine(v => Object.keys(v).length > 0, { message: 'Nothing to change.' })
export type UserPatchInput = z.infer<typeof UserPatchSchema>

export const IdParamSchema = z.object({ id: z.coerce.number().int().positive().max(MAX_ID) })
