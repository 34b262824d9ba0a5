import { IdParamSchema } from '#shared/schemas/user'
import { LEAD_ROLES } from '#shared/types/roles'

// Plans keep the cutter's name and sizes in their own input, so removing it loses no record.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireRole(event, ...LEAD_ROLES)
  const current = await findShopTool(user, id)
  // Remove the cutter, only within the user's shop, with its audit line in the same transaction
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    await tx.delete(tables.tools)
      .where(and(eq(tables.tools.id, id), eq(tables.tools.shopId, user.shopId)))
    await recordAudit(tx, user, 'tool.deleted', 'tool', id, { name: current.name })
  }))
  return { ok: true }
})
