import type { ShopUser } from './authz'

/** Appends one line to the shop's audit record (who changed people, roles and machines). */
export async function recordAudit(user: ShopUser, kind: string, subjectType: string, subjectId: string | number, detail?: Record<string, unknown>) {
  await useDB().insert(tables.auditEntries).values({
    shopId: user.shopId,
    actorId: user.id,
    kind,
    subjectType,
    subjectId: String(subjectId),
    detail: detail ?? null,
  })
}
