import { LEAD_ROLES } from '#shared/types/roles'

// Who can sign a guided run: the shop's active trainers and owners (names only).
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  // Active trainers and owners of this shop
  return useDB().select({ id: tables.users.id, name: tables.users.name, role: tables.users.role, hasPin: sql<boolean>`${tables.users.pinHash} is not null` })
    .from(tables.users)
    .where(and(eq(tables.users.shopId, user.shopId), eq(tables.users.active, true), inArray(tables.users.role, [...LEAD_ROLES])))
    .orderBy(asc(tables.users.name))
})
