// The signed-in person and their shop, as the app shell needs them.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  // The user's shop
  const [shop] = await useDB().select({ id: tables.shops.id, name: tables.shops.name, units: tables.shops.units })
    .from(tables.shops).where(eq(tables.shops.id, user.shopId)).limit(1)
  return { user, shop }
})
