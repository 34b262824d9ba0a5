import { ShopSettingsSchema } from '#shared/schemas/shop'

// The owner picks the paper the shop's printers take (A4 or Letter) for printed sheets.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, ShopSettingsSchema)
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    // The owner's shop
    await tx.update(tables.shops).set(body).where(eq(tables.shops.id, owner.shopId))
    await recordAudit(tx, owner, 'shop.settings-changed', 'shop', owner.shopId, body)
  }))
  // The shop as it is now
  const [shop] = await useDB().select({ id: tables.shops.id, name: tables.shops.name, units: tables.shops.units, paperSize: tables.shops.paperSize })
    .from(tables.shops).where(eq(tables.shops.id, owner.shopId)).limit(1)
  return shop
})
