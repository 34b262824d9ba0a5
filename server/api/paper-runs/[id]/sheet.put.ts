import { LEAD_ROLES } from '#shared/types/roles'
import { z } from 'zod'
import { PaperSheetSchema } from '#shared/schemas/paper-run'

const ParamsSchema = z.object({ id: z.uuid() })

// The photo of a paper run's sheet, once uploaded for that run (PUT /api/uploads/:id?runId=).
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireRole(event, ...LEAD_ROLES)
  const run = await findShopRun(user, id)
  const body = await readValid(event, PaperSheetSchema)
  return attachPaperSheet(user, run, body.uploadId)
})
