import { ToolCreateSchema } from '#shared/schemas/tool'

// Owners and trainers keep the shop's cutter list.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner', 'trainer')
  const body = await readValid(event, ToolCreateSchema)
  // A new cutter in the user's shop, stored together with its audit line
  const id = await useDB().transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.tools).values({ ...body, shopId: user.shopId }).$returningId() as [{ id: number }]
    await recordAudit(tx, user, 'tool.created', 'tool', id, { name: body.name })
    return id
  })
  setResponseStatus(event, 201)
  return findShopTool(user, id)
})
