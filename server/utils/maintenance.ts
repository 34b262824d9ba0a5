import type { ShopUser } from './authz'

// Maintenance intervals of a shop: the rows as the screens see them, and the check that the
// procedure and machine an interval names belong to the same shop.

export async function listIntervals(shopId: number, id?: number) {
  const i = tables.maintenanceIntervals
  // The shop's intervals with procedure titles and machine names
  return useDB().select({
    id: i.id, procedureId: i.procedureId, procedureTitle: tables.procedureVersions.title,
    machineId: i.machineId, machineName: tables.machines.name,
    everyDays: i.everyDays, everySpindleHours: i.everySpindleHours, createdAt: i.createdAt,
  }).from(i)
    .innerJoin(tables.procedures, eq(tables.procedures.id, i.procedureId))
    .leftJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.procedures.currentVersionId))
    .leftJoin(tables.machines, eq(tables.machines.id, i.machineId))
    .where(and(eq(i.shopId, shopId), id ? eq(i.id, id) : undefined))
    .orderBy(asc(i.id))
}

/** 400 with issues when the procedure or machine is not this shop's (or the machine is retired). */
export async function checkIntervalTargets(user: ShopUser, body: { procedureId?: number, machineId?: number | null }) {
  const issues: { path: string, message: string }[] = []
  if (body.procedureId !== undefined) {
    // The procedure, in this shop
    const [p] = await useDB().select({ id: tables.procedures.id, retiredAt: tables.procedures.retiredAt }).from(tables.procedures)
      .where(and(eq(tables.procedures.id, body.procedureId), eq(tables.procedures.shopId, user.shopId))).limit(1)
    if (!p) issues.push({ path: 'procedureId', message: 'No such procedure in this shop.' })
    else if (p.retiredAt) issues.push({ path: 'procedureId', message: 'That procedure is retired.' })
  }
  if (body.machineId !== undefined && body.machineId !== null) {
    // The machine, in this shop
    const [m] = await useDB().select({ id: tables.machines.id, retiredAt: tables.machines.retiredAt }).from(tables.machines)
      .where(and(eq(tables.machines.id, body.machineId), eq(tables.machines.shopId, user.shopId))).limit(1)
    if (!m) issues.push({ path: 'machineId', message: 'No such machine in this shop.' })
    else if (m.retiredAt) issues.push({ path: 'machineId', message: 'That machine is retired.' })
  }
  if (issues.length) {
    throw invalidIssues(issues)
  }
}

export async function findShopInterval(user: ShopUser, id: number) {
  const [row] = await listIntervals(user.shopId, id)
  if (!row) throw notFound('maintenance interval')
  return row
}
