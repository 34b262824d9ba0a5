import { IdParamSchema } from '#shared/schemas/user'

// Facings of the machine's spoilboard done in runs, newest first, with who ran them.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  await findShopMachine(user, id)
  // The machine's facings, only within the user's shop
  return useDB().select({
    runId: tables.spoilboardFacings.runId, depthMm: tables.spoilboardFacings.depthMm,
    thicknessMm: tables.spoilboardFacings.thicknessMm, facedAt: tables.spoilboardFacings.facedAt,
    byName: tables.users.name,
  }).from(tables.spoilboardFacings)
    .innerJoin(tables.runs, eq(tables.runs.id, tables.spoilboardFacings.runId))
    .innerJoin(tables.users, eq(tables.users.id, tables.runs.startedBy))
    .where(and(eq(tables.spoilboardFacings.shopId, user.shopId), eq(tables.spoilboardFacings.machineId, id)))
    .orderBy(desc(tables.spoilboardFacings.facedAt))
    .limit(100)
})
