import { IdParamSchema } from '#shared/schemas/user'

export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  const current = await findShopInterval(owner, id)
  // Remove the interval, only within the owner's shop
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    await tx.delete(tables.maintenanceIntervals)
      .where(and(eq(tables.maintenanceIntervals.id, id), eq(tables.maintenanceIntervals.shopId, owner.shopId)))
    await recordAudit(tx, owner, 'interval.deleted', 'maintenance_interval', id, { procedureId: current.procedureId, machineId: current.machineId })
  }))
  return { ok: true }
})
