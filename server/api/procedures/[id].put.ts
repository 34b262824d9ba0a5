import { IdParamSchema } from '#shared/schemas/user'
import { ProcedurePublishSchema } from '#shared/schemas/procedure'

// Editing publishes a new version; the old one stays exactly as runs followed it.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireRole(event, 'owner', 'trainer')
  const existing = await findShopProcedure(user, id)
  if (existing.retiredAt) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This procedure is retired; bring it back before publishing a new version.' })
  }
  const { procedure, changeNote } = await readValid(event, ProcedurePublishSchema)
  const result = await withWriteRetry(() => useDB().transaction(async (tx) => {
    const result = await publishVersion(tx, { shopId: user.shopId, procedureId: existing.id, procedure, createdBy: user.id, changeNote: changeNote ?? null })
    await recordAudit(tx, user, 'procedure.published', 'procedure', existing.id, { version: result.version })
    return result
  }))
  return { id: existing.id, ...result }
})
