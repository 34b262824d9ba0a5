import { InviteTokenSchema } from '#shared/schemas/invite'

// Public: what the join page shows before the person chooses a password.
export default defineEventHandler(async (event) => {
  const { token } = queryValid(event, InviteTokenSchema)
  // The invite with this token's hash, and its shop's name
  const [row] = await useDB().select({
    email: tables.invites.email, role: tables.invites.role, expiresAt: tables.invites.expiresAt,
    acceptedAt: tables.invites.acceptedAt, revokedAt: tables.invites.revokedAt, invitedBy: tables.invites.invitedBy, shop: tables.shops.name,
  }).from(tables.invites).innerJoin(tables.shops, eq(tables.shops.id, tables.invites.shopId))
    .where(eq(tables.invites.tokenHash, hashInviteToken(token))).limit(1)
  assertInviteUsable(row, row && await inviterOf(useDB(), row.invitedBy))
  return { shop: row!.shop, email: row!.email, role: row!.role, expiresAt: row!.expiresAt.toISOString() }
})
