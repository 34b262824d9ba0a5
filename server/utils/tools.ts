import type { ShopUser } from './authz'

/** Columns a client sees for a cutter (never the shop id). */
export const toolColumns = {
  id: tables.tools.id,
  name: tables.tools.name,
  kind: tables.tools.kind,
  diameterMm: tables.tools.diameterMm,
  flutes: tables.tools.flutes,
  cornerRadiusMm: tables.tools.cornerRadiusMm,
  maxRpm: tables.tools.maxRpm,
  notes: tables.tools.notes,
  updatedAt: tables.tools.updatedAt,
}

/** One cutter of the user's shop, or a 404 (another shop's cutter is simply not found). */
export async function findShopTool(user: ShopUser, id: number) {
  const [row] = await useDB().select(toolColumns).from(tables.tools)
    .where(and(eq(tables.tools.id, id), eq(tables.tools.shopId, user.shopId))).limit(1)
  if (!row) throw notFound('cutter')
  return row
}
