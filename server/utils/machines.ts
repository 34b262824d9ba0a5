import type { ShopUser } from './authz'

/** Columns a client sees for a machine (never the shop id). */
export const machineColumns = {
  id: tables.machines.id,
  name: tables.machines.name,
  travelXMm: tables.machines.travelXMm,
  travelYMm: tables.machines.travelYMm,
  travelZMm: tables.machines.travelZMm,
  units: tables.machines.units,
  spindleKind: tables.machines.spindleKind,
  hasLengthSensor: tables.machines.hasLengthSensor,
  spoilboardMaterial: tables.machines.spoilboardMaterial,
  spoilboardNominalMm: tables.machines.spoilboardNominalMm,
  spoilboardMinMm: tables.machines.spoilboardMinMm,
  accelMmS2: tables.machines.accelMmS2,
  rapidMmMin: tables.machines.rapidMmMin,
  dwellUnit: tables.machines.dwellUnit,
  notes: tables.machines.notes,
  retiredAt: tables.machines.retiredAt,
  updatedAt: tables.machines.updatedAt,
}

/** One machine of the user's shop, or a 404 (another shop's machine is simply not found). */
export async function findShopMachine(user: ShopUser, id: number) {
  const [row] = await useDB().select(machineColumns).from(tables.machines)
    .where(and(eq(tables.machines.id, id), eq(tables.machines.shopId, user.shopId))).limit(1)
  if (!row) throw notFound('machine')
  return row
}
