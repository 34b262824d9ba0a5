import { IdParamSchema, UserPatchSchema } from '#shared/schemas/user'

export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, UserPatchSchema)
  const db = useDB()

  // The person, only within the owner's shop
  const [target] = await db.select().from(tables.users)
    .where(and(eq(tables.users.id, id), eq(tables.users.shopId, owner.shopId))).limit(1)
  if (!target) throw notFound('person')
  if (target.id === owner.id && ((body.role && body.role !== 'owner') || body.active === false)) {
    throw invalidInput('role', 'You cannot remove your own owner role or deactivate yourself.')
  }
  const changes: Partial<typeof tables.users.$inferInsert> = {}
  if (body.name !== undefined) changes.name = body.name
  if (body.role !== undefined) changes.role = body.role
  if (body.active !== undefined) changes.active = body.active
  if (body.pin !== undefined) changes.pinHash = body.pin ? await hashPassword(body.pin) : null
  // The change and its audit line, together
  await withWriteRetry(() => db.transaction(async (tx) => {
    await tx.update(tables.users).set(changes).where(and(eq(tables.users.id, id), eq(tables.users.shopId, owner.shopId)))
    await recordAudit(tx, owner, 'user.changed', 'user', id, {
      ...(body.role !== undefined && { role: { from: target.role, to: body.role } }),
      ...(body.active !== undefined && { active: body.active }),
      ...(body.name !== undefined && { name: body.name }),
      ...(body.pin !== undefined && { pin: body.pin ? 'set' : 'cleared' }),
    })
  }))
  return { id, name: changes.name ?? target.name, email: target.email, role: changes.role ?? target.role, active: changes.active ?? target.active }
})
