// The shop's library: every procedure in use with its current version and steps, so a tablet
// can cache it and start a run offline.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  // The shop's procedures that are not retired
  const rows = await useDB().select({
    id: tables.procedures.id, slug: tables.procedures.slug, category: tables.procedures.category,
    currentVersionId: tables.procedures.currentVersionId,
  }).from(tables.procedures)
    .where(and(eq(tables.procedures.shopId, user.shopId), isNull(tables.procedures.retiredAt)))
  const versions = await loadVersions(user.shopId, rows.map(r => r.currentVersionId).filter((v): v is number => v !== null))
  return rows
    .filter(r => r.currentVersionId !== null && versions.has(r.currentVersionId))
    .map(r => ({ id: r.id, slug: r.slug, category: r.category, current: versions.get(r.currentVersionId!)! }))
    .sort((a, b) => a.current.title.localeCompare(b.current.title))
})
