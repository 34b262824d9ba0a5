import { LedgerQuerySchema } from '#shared/schemas/ledger'
import { LEAD_ROLES } from '#shared/types/roles'

// The Ledger table: overrides, events past a hold, out-of-range readings and skipped checks of
// this shop, filtered and paged on the server. Owner and trainer (read-only anyway).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  const { page, pageSize, ...filter } = queryValid(event, LedgerQuerySchema)
  return ledgerPage(user.shopId, filter, page, pageSize)
})
