// TEMPORARY: a minimal reading of maintenance_intervals for the daily digest until
// server/utils/due-list.ts (listDueItems, the due list's own rules) is in the tree. Remove this
// file and call listDueItems in mail-digest.ts then.
export interface DigestDueItem { procedureTitle: string, machineName: string, status: 'ok' | 'due' | 'overdue', reason: string }

export async function dueItemsForDigest(shopId: number, now: Date): Promise<DigestDueItem[]> {
  const db = useDB()
  // The shop's intervals with their procedure's current title
  const intervals = await db.select({
    procedureId: tables.maintenanceIntervals.procedureId, machineId: tables.maintenanceIntervals.machineId,
    everyDays: tables.maintenanceIntervals.everyDays, everySpindleHours: tables.maintenanceIntervals.everySpindleHours,
    title: tables.procedureVersions.title,
  }).from(tables.maintenanceIntervals)
    .innerJoin(tables.procedures, eq(tables.procedures.id, tables.maintenanceIntervals.procedureId))
    .innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.procedures.currentVersionId))
    .where(eq(tables.maintenanceIntervals.shopId, shopId))
  // The shop's machines in service
  const machines = await db.select({ id: tables.machines.id, name: tables.machines.name }).from(tables.machines)
    .where(and(eq(tables.machines.shopId, shopId), isNull(tables.machines.retiredAt)))
  const out: DigestDueItem[] = []
  for (const i of intervals) {
    for (const m of machines.filter(m => i.machineId === null || m.id === i.machineId)) {
      // The last finished run of this procedure on this machine
      const [last] = await db.select({ at: tables.runs.finishedAt }).from(tables.runs)
        .innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.runs.procedureVersionId))
        .where(and(eq(tables.runs.shopId, shopId), eq(tables.runs.machineId, m.id), eq(tables.procedureVersions.procedureId, i.procedureId), eq(tables.runs.status, 'finished')))
        .orderBy(desc(tables.runs.finishedAt)).limit(1)
      if (!i.everyDays) continue
      const days = last?.at ? (now.getTime() - last.at.getTime()) / 86_400_000 : Infinity
      const status = days > i.everyDays ? 'overdue' : days > i.everyDays - 1 ? 'due' : 'ok'
      out.push({ procedureTitle: i.title, machineName: m.name, status, reason: last?.at ? `last done ${Math.floor(days)} days ago; every ${i.everyDays} days` : `never done; every ${i.everyDays} days` })
    }
  }
  return out
}
