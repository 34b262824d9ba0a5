import { SyncRequestSchema } from '#shared/schemas/sync'

// Offline sync: a tablet sends its queued run events and gets back what it does not have yet.
// Each event is checked on its own in mergeSync, so one bad event is refused alone.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  const body = await readValid(event, SyncRequestSchema, ['events'])
  return mergeSync(user, body, clientAddress(event))
})
