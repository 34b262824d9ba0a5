import { IdParamSchema } from '#shared/schemas/user'

// One procedure with its current version and the list of every version published.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  const procedure = await findShopProcedure(user, id)
  // All versions of this procedure, newest first, with who published them
  const history = await useDB().select({
    id: tables.procedureVersions.id, version: tables.procedureVersions.version, title: tables.procedureVersions.title,
    changeNote: tables.procedureVersions.changeNote, createdAt: tables.procedureVersions.createdAt, createdBy: tables.users.name,
  }).from(tables.procedureVersions)
    .leftJoin(tables.users, eq(tables.users.id, tables.procedureVersions.createdBy))
    .where(eq(tables.procedureVersions.procedureId, procedure.id))
    .orderBy(desc(tables.procedureVersions.version))
  const current = procedure.currentVersionId ? (await loadVersions(user.shopId, [procedure.currentVersionId])).get(procedure.currentVersionId) : undefined
  return { id: procedure.id, slug: procedure.slug, category: procedure.category, retiredAt: procedure.retiredAt, current, history }
})
