import { LedgerRunsQuerySchema } from '#shared/schemas/ledger'
import { LEAD_ROLES } from '#shared/types/roles'

// The Ledger's run list: every run of the shop (newest first) with who, machine, procedure and
// how many overrides, photos and sign-offs it holds; each links to its record (timeline).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  const q = queryValid(event, LedgerRunsQuerySchema)
  const r = tables.runs
  const where = [eq(r.shopId, user.shopId)]
  if (q.status) where.push(eq(r.status, q.status))
  if (q.actorId) where.push(eq(r.startedBy, q.actorId))
  if (q.machineId) where.push(eq(r.machineId, q.machineId))
  if (q.procedureId) where.push(eq(tables.procedureVersions.procedureId, q.procedureId))
  if (q.from) where.push(gte(r.startedAt, q.from))
  if (q.to) where.push(lte(r.startedAt, q.to))
  // Runs with at least one entry of that kind (ledger_entries_shop_kind_idx)
  if (q.kind) {
    const l = tables.ledgerEntries
    where.push(inArray(r.id, useDB().select({ id: l.runId }).from(l).where(and(eq(l.shopId, user.shopId), eq(l.kind, q.kind)))))
  }
  const db = useDB()
  const byProcedure = q.procedureId !== undefined
  // Ids of the page first (runs alone, joined to versions only to filter by procedure), then
  // names for those ten or so: one joined, sorted query made MariaDB sort the whole shop.
  let idsQuery = db.select({ id: r.id }).from(r).$dynamic()
  let countQuery = db.select({ n: count() }).from(r).$dynamic()
  if (byProcedure) {
    idsQuery = idsQuery.innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, r.procedureVersionId))
    countQuery = countQuery.innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, r.procedureVersionId))
  }
  const [ids, [total]] = await Promise.all([
    // Ids of the page, newest first
    idsQuery.where(and(...where)).orderBy(desc(r.startedAt), desc(r.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
    // How many runs match
    countQuery.where(and(...where)),
  ])
  // The page's runs with names
  const found = ids.length
    ? await db.select({
        id: r.id, status: r.status, mode: r.mode, startedAt: r.startedAt, finishedAt: r.finishedAt, spindleMinutes: r.spindleMinutes,
        startedBy: r.startedBy, startedByName: tables.users.name, machineId: r.machineId, machineName: tables.machines.name,
        procedureId: tables.procedureVersions.procedureId, procedureTitle: tables.procedureVersions.title, version: tables.procedureVersions.version,
      }).from(r)
        .innerJoin(tables.users, eq(tables.users.id, r.startedBy))
        .innerJoin(tables.machines, eq(tables.machines.id, r.machineId))
        .innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, r.procedureVersionId))
        .where(inArray(r.id, ids.map(x => x.id)))
    : []
  const byId = new Map(found.map(x => [x.id, x]))
  const rows = ids.flatMap(x => (byId.has(x.id) ? [byId.get(x.id)!] : []))
  const counts = new Map<string, { overrides: number, photos: number, signoffs: number }>()
  if (rows.length) {
    const e = tables.runEvents
    // Events that took effect (no flag) per run of the page. A photo whose step was undone no
    // longer counts; overrides and sign-offs cannot be undone (the fold refuses it).
    const kept = await db.select({ id: e.id, runId: e.runId, type: e.type, payload: e.payload }).from(e)
      .where(and(eq(e.shopId, user.shopId), inArray(e.runId, rows.map(x => x.id)), isNull(e.flag), inArray(e.type, ['hold.overridden', 'photo.attached', 'signoff.given', 'event.undone'])))
    const undone = new Set(kept.filter(x => x.type === 'event.undone').map(x => String(x.payload.targetId)))
    for (const x of kept) {
      if (x.type === 'event.undone' || undone.has(x.id)) continue
      const c = counts.get(x.runId) ?? { overrides: 0, photos: 0, signoffs: 0 }
      if (x.type === 'hold.overridden') c.overrides++
      else if (x.type === 'photo.attached') c.photos++
      else c.signoffs++
      counts.set(x.runId, c)
    }
  }
  return {
    rows: rows.map(x => ({
      ...x, startedAt: x.startedAt.toISOString(), finishedAt: x.finishedAt?.toISOString() ?? null,
      ...(counts.get(x.id) ?? { overrides: 0, photos: 0, signoffs: 0 }),
    })),
    total: total?.n ?? 0, page: q.page, pageSize: q.pageSize,
  }
})
