import { ToolPatchSchema } from '#shared/schemas/tool'
import { IdParamSchema } from '#shared/schemas/user'
import { LEAD_ROLES } from '#shared/types/roles'

export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireRole(event, ...LEAD_ROLES)
  // Another shop's cutter is 404 before its body is read.
  const current = await findShopTool(user, id)
  const body = await readValid(event, ToolPatchSchema)
  const diameter = body.diameterMm ?? current.diameterMm
  if ((body.cornerRadiusMm ?? current.cornerRadiusMm) > diameter / 2 + 1e-9) {
    const message = 'The corner radius cannot be more than half the diameter.'
    throw invalidInput('cornerRadiusMm', message)
  }
  // Change the cutter, only within the user's shop, with its audit line in the same transaction
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    await tx.update(tables.tools).set(body)
      .where(and(eq(tables.tools.id, id), eq(tables.tools.shopId, user.shopId)))
    await recordAudit(tx, user, 'tool.changed', 'tool', id, { fields: Object.keys(body) })
  }))
  return findShopTool(user, id)
})
