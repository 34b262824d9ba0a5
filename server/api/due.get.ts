// The due list: every maintenance interval on every machine it applies to, worst first.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  // Procedure titles in the reader's language
  return listDueItems(user.shopId, new Date(), callerLanguage(event))
})
