import { z } from 'zod'

export const LoginSchema = z.object({
  email: z.string({ error: 'Enter your e-mail address.' }).trim().toLowerCase()
    .max(254, 'That e-mail address is too long.')
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200, 'That password is too long.'),
}).strict()

export type LoginInput = z.infer<typeof LoginSchema>
