import { IntervalCreateSchema } from '#shared/schemas/maintenance'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, IntervalCreateSchema)
  await checkIntervalTargets(owner, body)
  // Add the interval to the owner's shop
  const row = await withWriteRetry(() => useDB().transaction(async (tx) => {
    const [row] = await tx.insert(tables.maintenanceIntervals).values({ ...body, shopId: owner.shopId }).$returningId()
    await recordAudit(tx, owner, 'interval.created', 'maintenance_interval', row!.id, body)
    return row
  }))
  setResponseStatus(event, 201)
  return findShopInterval(owner, row!.id)
})
