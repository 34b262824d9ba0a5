import { z } from 'zod'
import { IdParamSchema } from '#shared/schemas/user'

const QuerySchema = z.object({
  limit: z.coerce.number({ error: 'limit must be a number.' }).int({ error: 'limit must be a whole number.' })
    .min(1, { error: 'limit must be at least 1.' }).max(500, { error: 'limit must be at most 500.' }).default(100),
})

// Everyone in the shop reads a machine's board history (the Board screen).
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  const machine = await findShopMachine(user, id)
  const { limit } = queryValid(event, QuerySchema)
  return (await loadBoardHistory(user, machine)).slice(0, limit)
})
