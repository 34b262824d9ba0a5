import type { ShopUser } from './authz'

/** One procedure of the user's shop, or a 404. */
export async function findShopProcedure(user: ShopUser, id: number) {
  const [row] = await useDB().select().from(tables.procedures)
    .where(and(eq(tables.procedures.id, id), eq(tables.procedures.shopId, user.shopId))).limit(1)
  if (!row) throw notFound('procedure')
  return row
}
