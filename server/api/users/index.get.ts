import { LEAD_ROLES } from '#shared/types/roles'

// Owners manage the crew; trainers see it read-only.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  // Everyone in the signed-in user's shop
  return useDB().select({
    id: tables.users.id, name: tables.users.name, email: tables.users.email,
    role: tables.users.role, active: tables.users.active, hasPin: sql<boolean>`${tables.users.pinHash} is not null`,
  }).from(tables.users).where(eq(tables.users.shopId, user.shopId)).orderBy(asc(tables.users.name))
})
