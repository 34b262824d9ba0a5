import { z } from 'zod'

const QuerySchema = z.object({
  retired: z.enum(['include', 'exclude'], { error: 'retired must be include or exclude.' }).default('exclude'),
})

export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  const { retired } = queryValid(event, QuerySchema)
  // The shop's machines, retired ones only when asked for
  const where = retired === 'include'
    ? eq(tables.machines.shopId, user.shopId)
    : and(eq(tables.machines.shopId, user.shopId), isNull(tables.machines.retiredAt))
  return useDB().select(machineColumns).from(tables.machines).where(where).orderBy(asc(tables.machines.name))
})
