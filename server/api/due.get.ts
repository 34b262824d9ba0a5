// The due list: every maintenance interval on every machine it applies to, worst first.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  return listDueItems(user.shopId)
})
