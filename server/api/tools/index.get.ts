// The shop's cutters; everyone reads them (the Planner and Feeds pick from this list).
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  // Every cutter of the user's shop, by name
  return useDB().select(toolColumns).from(tables.tools)
    .where(eq(tables.tools.shopId, user.shopId)).orderBy(tables.tools.name, tables.tools.id)
})
