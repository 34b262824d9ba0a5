import { inviteStatus } from '#shared/schemas/invite'
import { IdParamSchema } from '#shared/schemas/user'

// The owner withdraws an invite; its link answers 410 from then on.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  const db = useDB()
  // The invite, only within the owner's shop
  const [row] = await db.select().from(tables.invites)
    .where(and(eq(tables.invites.id, id), eq(tables.invites.shopId, owner.shopId))).limit(1)
  if (!row) throw notFound('invite')
  if (row.acceptedAt) {
    throw conflict('This invite was already accepted; deactivate the person on the Crew screen instead.')
  }
  if (!row.revokedAt) {
    // Stamp revoked_at unless it was accepted meanwhile
    await db.transaction(async (tx) => {
      await tx.update(tables.invites).set({ revokedAt: new Date() })
        .where(and(eq(tables.invites.id, id), isNull(tables.invites.acceptedAt), isNull(tables.invites.revokedAt)))
      await recordAudit(tx, owner, 'invite.revoked', 'invite', id, { email: row.email })
    })
  }
  const [now] = await db.select().from(tables.invites).where(eq(tables.invites.id, id)).limit(1)
  return { id, email: now!.email, role: now!.role, status: inviteStatus(now!) }
})
