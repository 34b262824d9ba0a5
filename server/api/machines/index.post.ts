import { MachineCreateSchema } from '#shared/schemas/machine'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, MachineCreateSchema)
  // A new machine in the owner's shop
  const [{ id }] = await useDB().insert(tables.machines).values({ ...body, shopId: owner.shopId }).$returningId() as [{ id: number }]
  await recordAudit(owner, 'machine.created', 'machine', id, { name: body.name })
  setResponseStatus(event, 201)
  return findShopMachine(owner, id)
})
