import { UserCreateSchema } from '#shared/schemas/user'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, UserCreateSchema)
  const db = useDB()

  // Is the e-mail address already taken (in any shop)? One answer for every shop, so an owner
  // learns nothing about who signs in elsewhere; an invite (neutral too) is the other way in.
  const [taken] = await db.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, body.email)).limit(1)
  if (taken) {
    const message = 'That e-mail address cannot be used for a new sign-in. Use another address, or send an invite instead.'
    throw conflict(`email: ${message}`, [{ path: 'email', message }])
  }
  const passwordHash = await hashPassword(body.password)
  const pinHash = body.pin ? await hashPassword(body.pin) : null
  // The new person and the audit line, together
  const id = await withWriteRetry(() => db.transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.users).values({
      shopId: owner.shopId, name: body.name, email: body.email, role: body.role, passwordHash, pinHash,
    }).$returningId() as [{ id: number }]
    await recordAudit(tx, owner, 'user.created', 'user', id, { role: body.role })
    return id
  }))
  setResponseStatus(event, 201)
  return { id, name: body.name, email: body.email, role: body.role, active: true }
})
