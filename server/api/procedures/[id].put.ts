import { IdParamSchema } from '#shared/schemas/user'
import { ProcedurePublishSchema } from '#shared/schemas/procedure'
import { LEAD_ROLES } from '#shared/types/roles'

// Editing publishes a new version; the old one stays exactly as runs followed it.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireRole(event, ...LEAD_ROLES)
  const existing = await findShopProcedure(user, id)
  if (existing.retiredAt) {
    throw conflict('This procedure is retired; bring it back before publishing a new version.')
  }
  const { procedure, changeNote } = await readValid(event, ProcedurePublishSchema)
  const result = await withWriteRetry(() => useDB().transaction(async (tx) => {
    const result = await publishVersion(tx, { shopId: user.shopId, procedureId: existing.id, procedure, createdBy: user.id, changeNote: changeNote ?? null })
    await recordAudit(tx, user, 'procedure.published', 'procedure', existing.id, { version: result.version })
    return result
  }))
  return { id: existing.id, ...result }
})
