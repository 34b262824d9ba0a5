import { UserCreateSchema } from '#shared/schemas/user'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, UserCreateSchema)
  const db = useDB()

  // Is the e-mail address already taken (in any shop)?
  const [taken] = await db.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, body.email)).limit(1)
  if (taken) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: someone already uses that e-mail address.', data: { issues: [{ path: 'email', message: 'Someone already uses that e-mail address.' }] } })
  }
  const passwordHash = await hashPassword(body.password)
  const pinHash = body.pin ? await hashPassword(body.pin) : null
  // The new person and the audit line, together
  const id = await db.transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.users).values({
      shopId: owner.shopId, name: body.name, email: body.email, role: body.role, passwordHash, pinHash,
    }).$returningId() as [{ id: number }]
    await recordAudit(tx, owner, 'user.created', 'user', id, { role: body.role })
    return id
  })
  setResponseStatus(event, 201)
  return { id, name: body.name, email: body.email, role: body.role, active: true }
})
