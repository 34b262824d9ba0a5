import { ToolCreateSchema } from '#shared/schemas/tool'
import { LEAD_ROLES } from '#shared/types/roles'

// Owners and trainers keep the shop's cutter list.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  const body = await readValid(event, ToolCreateSchema)
  // A new cutter in the user's shop, and its audit line, in one transaction
  const id = await withWriteRetry(() => useDB().transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.tools).values({ ...body, shopId: user.shopId }).$returningId() as [{ id: number }]
    await recordAudit(tx, user, 'tool.created', 'tool', id, { name: body.name })
    return id
  }))
  setResponseStatus(event, 201)
  return findShopTool(user, id)
})
