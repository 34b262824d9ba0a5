import { inviteStatus } from '#shared/schemas/invite'

// The owner's invites with their state, newest first.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  // Invites of the owner's shop, with who sent them
  const rows = await useDB().select({
    id: tables.invites.id, email: tables.invites.email, role: tables.invites.role,
    expiresAt: tables.invites.expiresAt, acceptedAt: tables.invites.acceptedAt, revokedAt: tables.invites.revokedAt,
    createdAt: tables.invites.createdAt, invitedBy: tables.users.name,
  }).from(tables.invites).innerJoin(tables.users, eq(tables.users.id, tables.invites.invitedBy))
    .where(eq(tables.invites.shopId, owner.shopId))
    .orderBy(desc(tables.invites.createdAt), desc(tables.invites.id)).limit(200)
  const now = new Date()
  return rows.map(r => ({ ...r, status: inviteStatus(r, now) }))
})
