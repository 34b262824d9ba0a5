import { IdParamSchema } from '#shared/schemas/user'
import { MachinePatchSchema } from '#shared/schemas/machine'

export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const owner = await requireRole(event, 'owner')
  // Another shop's machine is 404 before its body is even read.
  const current = await findShopMachine(owner, id)
  const body = await readValid(event, MachinePatchSchema)
  // The minimum must stay below the nominal thickness after a partial change too.
  const nominal = body.spoilboardNominalMm ?? current.spoilboardNominalMm
  const min = body.spoilboardMinMm ?? current.spoilboardMinMm
  if (min >= nominal) {
    throw invalidInput('spoilboardMinMm', 'The minimum thickness must be less than the nominal thickness.')
  }
  // Update the machine, only within the owner's shop
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    await tx.update(tables.machines).set(body)
      .where(and(eq(tables.machines.id, id), eq(tables.machines.shopId, owner.shopId)))
    await recordAudit(tx, owner, 'machine.changed', 'machine', id, { fields: Object.keys(body) })
  }))
  return findShopMachine(owner, id)
})
