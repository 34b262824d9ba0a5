import { LoginSchema } from '#shared/schemas/auth'

// A fixed hash to verify against when the e-mail is unknown, so both failures take as long.
let decoy: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const { email, password } = await readValid(event, LoginSchema)
  // Throttled accounts and addresses get 429 before the password is looked at (sign-in-throttle.ts).
  const attempt = await beginSignInAttempt(event, email)

  // The user with this e-mail, with their shop
  const [row] = await useDB().select().from(tables.users).where(eq(tables.users.email, email)).limit(1)
  decoy ??= hashPassword('jogwise-decoy-password')
  const ok = row ? await verifyPassword(row.passwordHash, password) : (await verifyPassword(await decoy, password), false)
  if (!row || !ok) {
    await attempt.failed()
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'That e-mail and password do not match a Jogwise account.' })
  }
  await attempt.succeeded()
  if (!row.active) {
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'This account has been deactivated. Ask the shop owner.' })
  }
  const user = { id: row.id, shopId: row.shopId, name: row.name, email: row.email, role: row.role, language: row.language }
  await setUserSession(event, { user, loggedInAt: Date.now() })
  return { user }
})
