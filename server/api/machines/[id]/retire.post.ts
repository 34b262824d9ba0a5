import { IdParamSchema } from '#shared/schemas/user'

// Retiring keeps the machine and its history but takes it off the Floor.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  await findShopMachine(owner, id)
  // Mark the machine retired, only within the owner's shop
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    await tx.update(tables.machines).set({ retiredAt: new Date() })
      .where(and(eq(tables.machines.id, id), eq(tables.machines.shopId, owner.shopId), isNull(tables.machines.retiredAt)))
    await recordAudit(tx, owner, 'machine.retired', 'machine', id)
  }))
  return findShopMachine(owner, id)
})
