import { MachineCreateSchema } from '#shared/schemas/machine'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, MachineCreateSchema)
  // A new machine in the owner's shop, with its audit line
  const id = await withWriteRetry(() => useDB().transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.machines).values({ ...body, shopId: owner.shopId }).$returningId() as [{ id: number }]
    await recordAudit(tx, owner, 'machine.created', 'machine', id, { name: body.name })
    return id
  }))
  setResponseStatus(event, 201)
  return findShopMachine(owner, id)
})
