import { IntervalPatchSchema } from '#shared/schemas/maintenance'
import { IdParamSchema } from '#shared/schemas/user'

export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  // Another shop's interval is 404 before its body is read.
  const current = await findShopInterval(owner, id)
  const body = await readValid(event, IntervalPatchSchema)
  const everyDays = body.everyDays !== undefined ? body.everyDays : current.everyDays
  const everySpindleHours = body.everySpindleHours !== undefined ? body.everySpindleHours : current.everySpindleHours
  if (everyDays == null && everySpindleHours == null) {
    throw invalidInput('everyDays', 'Give a number of days, of spindle hours, or both.')
  }
  await checkIntervalTargets(owner, body)
  // Change the interval, only within the owner's shop
  await useDB().transaction(async (tx) => {
    await tx.update(tables.maintenanceIntervals).set(body)
      .where(and(eq(tables.maintenanceIntervals.id, id), eq(tables.maintenanceIntervals.shopId, owner.shopId)))
    await recordAudit(tx, owner, 'interval.changed', 'maintenance_interval', id, { fields: Object.keys(body) })
  })
  return findShopInterval(owner, id)
})
