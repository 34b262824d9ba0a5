import type { SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/mysql-core'
import { ledgerSummary, type LedgerFilter } from '#shared/schemas/ledger'

// The Ledger's reads: one WHERE for the table, the count and the CSV export, so the three can
// never disagree about what a filter means. Every filter is a column of ledger_entries with an
// index that starts with shop_id, so the first page is an index range read.

export function ledgerWhere(shopId: number, f: LedgerFilter): SQL {
  const l = tables.ledgerEntries
  const where: (SQL | undefined)[] = [eq(l.shopId, shopId)]
  if (f.kind) where.push(eq(l.kind, f.kind))
  if (f.actorId) where.push(eq(l.actorId, f.actorId))
  if (f.machineId) where.push(eq(l.machineId, f.machineId))
  if (f.procedureId) where.push(eq(l.procedureId, f.procedureId))
  if (f.from) where.push(gte(l.at, f.from))
  if (f.to) where.push(lte(l.at, f.to))
  return and(...where)!
}

const currentVersion = alias(tables.procedureVersions, 'current_version')

/** The joined columns of a Ledger row; names, not ids, are what people read. */
function selectRows(db: DB, where: SQL) {
  const l = tables.ledgerEntries
  return db.select({
    id: l.id, eventId: l.eventId, runId: l.runId, kind: l.kind, at: l.at, stepKey: l.stepKey, detail: l.detail,
    actorId: l.actorId, actorName: tables.users.name, machineId: l.machineId, machineName: tables.machines.name,
    procedureId: l.procedureId, procedureTitle: currentVersion.title,
  }).from(l)
    .innerJoin(tables.users, eq(tables.users.id, l.actorId))
    .innerJoin(tables.machines, eq(tables.machines.id, l.machineId))
    .innerJoin(tables.procedures, eq(tables.procedures.id, l.procedureId))
    .leftJoin(currentVersion, eq(currentVersion.id, tables.procedures.currentVersionId))
    .where(where)
}

export type LedgerRow = ReturnType<typeof shapeRow>

function shapeRow(r: Awaited<ReturnType<typeof selectRows>>[number]) {
  const detail = (r.detail ?? {}) as Record<string, unknown>
  return {
    id: r.id, eventId: r.eventId, runId: r.runId, kind: r.kind, at: r.at.toISOString(),
    actorId: r.actorId, actorName: r.actorName, machineId: r.machineId, machineName: r.machineName,
    procedureId: r.procedureId, procedureTitle: r.procedureTitle ?? `Procedure ${r.procedureId}`,
    stepKey: r.stepKey, stepTitle: typeof detail.stepTitle === 'string' ? detail.stepTitle : r.stepKey,
    summary: ledgerSummary(r.kind, detail), detail,
  }
}

// Two steps on purpose: the ids of the page come from ledger_entries alone (a range of one
// shop_id index, already in order), then only those rows are joined to names. In one joined
// query MariaDB liked to start from the small procedures table and sort every entry of the
// shop in a temporary table (bench/ledger.ts showed it).
async function pageOfIds(db: DB, where: SQL, limit: number, offset = 0) {
  const l = tables.ledgerEntries
  // Ids (and times, for the next keyset batch) of the page, newest first
  return db.select({ id: l.id, at: l.at }).from(l).where(where).orderBy(desc(l.at), desc(l.id)).limit(limit).offset(offset)
}

async function rowsFor(db: DB, ids: number[]) {
  if (!ids.length) return []
  // The page's entries with names
  const rows = await selectRows(db, inArray(tables.ledgerEntries.id, ids))
  const byId = new Map(rows.map(r => [r.id, r]))
  return ids.flatMap(id => (byId.has(id) ? [shapeRow(byId.get(id)!)] : []))
}

/** One page, newest first (ties by id so paging is stable), and the filtered total. */
export async function ledgerPage(shopId: number, f: LedgerFilter, page: number, pageSize: number) {
  const db = useDB()
  const where = ledgerWhere(shopId, f)
  const [ids, [total]] = await Promise.all([
    pageOfIds(db, where, pageSize, (page - 1) * pageSize),
    // How many entries match
    db.select({ n: count() }).from(tables.ledgerEntries).where(where),
  ])
  return { rows: await rowsFor(db, ids.map(r => r.id)), total: total?.n ?? 0, page, pageSize }
}

/**
 * Every matching entry, newest first, in batches read by keyset (at, id) so memory stays flat
 * however large the set is and no batch re-reads the rows before it (OFFSET would).
 */
export async function* ledgerAll(shopId: number, f: LedgerFilter, batch = 2000): AsyncGenerator<LedgerRow> {
  const db = useDB()
  const l = tables.ledgerEntries
  const base = ledgerWhere(shopId, f)
  let after: { at: Date, id: number } | null = null
  for (;;) {
    const where: SQL = after
      ? and(base, or(lt(l.at, after.at), and(eq(l.at, after.at), lt(l.id, after.id))))!
      : base
    const ids = await pageOfIds(db, where, batch)
    for (const r of await rowsFor(db, ids.map(x => x.id))) yield r
    if (ids.length < batch) return
    const last = ids.at(-1)!
    after = { at: last.at, id: last.id }
  }
}

/** The CSV's columns, in order: the table's columns plus ids and the detail as JSON. */
export const LEDGER_CSV_COLUMNS = [
  { key: 'at', header: 'When (UTC)' },
  { key: 'kind', header: 'Kind' },
  { key: 'actorName', header: 'Person' },
  { key: 'machineName', header: 'Machine' },
  { key: 'procedureTitle', header: 'Procedure' },
  { key: 'stepTitle', header: 'Step' },
  { key: 'summary', header: 'What happened' },
  { key: 'runId', header: 'Run' },
  { key: 'eventId', header: 'Event' },
  { key: 'detail', header: 'Detail (JSON)' },
] as const

export function ledgerCsvRecord(r: LedgerRow): string[] {
  return LEDGER_CSV_COLUMNS.map(c => (c.key === 'detail' ? JSON.stringify(r.detail) : String(r[c.key] ?? '')))
}
