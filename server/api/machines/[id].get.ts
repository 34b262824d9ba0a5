import { IdParamSchema } from '#shared/schemas/user'

export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  return findShopMachine(user, id)
})
