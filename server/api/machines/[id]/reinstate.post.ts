import { IdParamSchema } from '#shared/schemas/user'

// Brings a retired machine back onto the Floor.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  await findShopMachine(owner, id)
  // Clear the retirement, only within the owner's shop
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    await tx.update(tables.machines).set({ retiredAt: null })
      .where(and(eq(tables.machines.id, id), eq(tables.machines.shopId, owner.shopId)))
    await recordAudit(tx, owner, 'machine.reinstated', 'machine', id)
  }))
  return findShopMachine(owner, id)
})
