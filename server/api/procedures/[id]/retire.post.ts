import { IdParamSchema } from '#shared/schemas/user'
import { LEAD_ROLES } from '#shared/types/roles'

// Retiring hides a procedure from the Library; its versions and runs stay on record.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireRole(event, ...LEAD_ROLES)
  await findShopProcedure(user, id)
  // Mark it retired, only in this shop
  await useDB().transaction(async (tx) => {
    await tx.update(tables.procedures).set({ retiredAt: new Date() })
      .where(and(eq(tables.procedures.id, id), eq(tables.procedures.shopId, user.shopId)))
    await recordAudit(tx, user, 'procedure.retired', 'procedure', id)
  })
  return { id, retired: true }
})
