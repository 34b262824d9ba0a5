import { IdParamSchema } from '#shared/schemas/user'

// The exact version a run follows, even after newer versions were published.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  const version = (await loadVersions(user.shopId, [id])).get(id)
  if (!version) throw notFound('procedure version')
  return version
})
