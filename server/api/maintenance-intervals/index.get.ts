// Every maintenance interval of the shop; everyone may read them (the due list is for all).
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  return listIntervals(user.shopId)
})
