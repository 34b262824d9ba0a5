import type { ShopUser } from './authz'

/** The run row's own columns (procedure version, machine, mode, status…), as stored. */
export type ShopRun = typeof tables.runs.$inferSelect

/**
 * One run of the user's shop, or a 404 (another shop's run is simply not found), beside
 * findShopMachine. Routes that name a run in their body rather than their path check it with
 * `shopRunOrNull` and say which field is wrong.
 */
export async function findShopRun(user: ShopUser, id: string): Promise<ShopRun> {
  const run = await shopRunOrNull(user, id)
  if (!run) throw notFound('run')
  return run
}

export async function shopRunOrNull(user: ShopUser, id: string): Promise<ShopRun | null> {
  const [run] = await useDB().select().from(tables.runs)
    .where(and(eq(tables.runs.id, id), eq(tables.runs.shopId, user.shopId))).limit(1)
  return run ?? null
}
