import { isLeadRole } from '#shared/types/roles'

// Who may run which procedure unsupervised. Leads see everyone's; others see their own, which
// is what their tablet needs to choose guided or solo mode, also offline.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  const lead = isLeadRole(user.role)
  // Qualifications in this shop (only the person's own unless a lead)
  return useDB().select({ userId: tables.qualifications.userId, procedureId: tables.qualifications.procedureId, createdAt: tables.qualifications.createdAt })
    .from(tables.qualifications)
    .where(lead ? eq(tables.qualifications.shopId, user.shopId) : and(eq(tables.qualifications.shopId, user.shopId), eq(tables.qualifications.userId, user.id)))
})
