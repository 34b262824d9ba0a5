import type { ShopUser } from './authz'
import type { DB, Tx } from './db'

/**
 * Appends one line to the shop's audit record (who changed people, roles and machines). Pass the
 * transaction that makes the change, so the change and its line are stored together or not at
 * all (a failed line never leaves a half write that a retry would duplicate).
 */
export async function recordAudit(db: DB | Tx, user: ShopUser, kind: string, subjectType: string, subjectId: string | number, detail?: Record<string, unknown>) {
  await db.insert(tables.auditEntries).values({
    shopId: user.shopId,
    actorId: user.id,
    kind,
    subjectType,
    subjectId: String(subjectId),
    detail: detail ?? null,
  })
}
