// The signed-in person's shop and its settings: the printed sheets' paper size, and the id that
// machine tags carry so a tablet can tell its own shop's tags from another shop's.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  // The user's shop
  const [shop] = await useDB().select({ id: tables.shops.id, name: tables.shops.name, units: tables.shops.units, paperSize: tables.shops.paperSize })
    .from(tables.shops).where(eq(tables.shops.id, user.shopId)).limit(1)
  if (!shop) throw notFound('shop')
  return shop
})
