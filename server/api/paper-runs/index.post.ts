import { LEAD_ROLES } from '#shared/types/roles'
import { PaperRunSchema } from '#shared/schemas/paper-run'

// A run done on a printed sheet, entered afterwards (server/utils/paper-run.ts).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  const body = await readValid(event, PaperRunSchema)
  const out = await enterPaperRun(user, body)
  setResponseStatus(event, out.created ? 201 : 200)
  return out
})
