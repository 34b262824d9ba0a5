import type { SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/mysql-core'
import { LEDGER_KIND_LABELS, ledgerSummary, type LedgerFilter } from '#shared/schemas/ledger'

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
    receivedAt: l.receivedAt, recordedAt: l.recordedAt, revision: l.revision, counted: l.counted, changedAt: l.changedAt, changedBy: l.changedBy,
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
    receivedAt: r.receivedAt?.toISOString() ?? null, recordedAt: r.recordedAt.toISOString(), revision: r.revision,
    counted: r.counted, changedAt: r.changedAt?.toISOString() ?? null, changedBy: r.changedBy,
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

// The CSV is for people first (readable kind names, local time beside UTC, the details in
// columns of their own) and keeps the whole detail as JSON in the last column for programs.
// Column headers, kind names, yes/no and the summaries are in the caller's language (the `csv`
// section); the code columns (kind code, ids, JSON) stay as they are for programs.
// Every text cell goes through safeCsvCell (formula injection); numbers stay numbers.
type Cell = string | number | null | undefined
const text = (v: unknown): string => (v === null || v === undefined ? '' : typeof v === 'object' ? JSON.stringify(v) : String(v))
const num = (v: unknown): Cell => (typeof v === 'number' && Number.isFinite(v) ? v : text(v))

export function ledgerCsvColumns(timeZone: string, lang = 'en') {
  const localTime = localTimeFormatter(timeZone)
  const h = (key: string, values: Record<string, string> = {}) => messageIn(lang, `csv.${key}`, values)
  const kindName = (kind: string) => {
    const name = messageIn(lang, `ledgerKinds.${kind}`)
    return name === `ledgerKinds.${kind}` ? (LEDGER_KIND_LABELS[kind as keyof typeof LEDGER_KIND_LABELS] ?? kind) : name
  }
  const cols: { header: string, value: (r: LedgerRow) => Cell }[] = [
    { header: h('whenUtc'), value: r => r.at },
    { header: h('whenLocal', { zone: timeZone }), value: r => localTime(r.at) },
    { header: h('receivedUtc'), value: r => r.receivedAt },
    { header: h('kind'), value: r => kindName(r.kind) },
    { header: h('counted'), value: r => (r.counted ? h('yes') : h('no')) },
    { header: h('notCountedBecause'), value: r => textIn(lang, text(r.detail.notCounted)) },
    { header: h('changedLater'), value: r => (r.changedAt ? h('yesSee', { id: text(r.changedBy) }).trim() : h('no')) },
    { header: h('person'), value: r => r.actorName },
    { header: h('machine'), value: r => r.machineName },
    { header: h('procedure'), value: r => r.procedureTitle },
    { header: h('step'), value: r => r.stepTitle },
    { header: h('what'), value: r => textIn(lang, r.summary) },
    { header: h('reason'), value: r => text(r.detail.reason) },
    { header: h('reading'), value: r => num(r.detail.value) },
    { header: h('unit'), value: r => text(r.detail.unit) },
    { header: h('range'), value: r => text(r.detail.range) },
    { header: h('signalWord'), value: r => text(r.detail.signalWord) },
    // The language of the text on screen at an acknowledgement or sign-off (issue 16).
    { header: h('language'), value: r => text(r.detail.lang) },
    { header: h('entry'), value: r => r.id },
    { header: h('revision'), value: r => r.revision },
    { header: h('run'), value: r => r.runId },
    { header: h('event'), value: r => r.eventId },
    { header: h('kindCode'), value: r => r.kind },
    { header: h('detail'), value: r => JSON.stringify(r.detail) },
  ]
  return cols
}

export function ledgerCsvRecord(r: LedgerRow, columns: ReturnType<typeof ledgerCsvColumns>): (string | number)[] {
  return columns.map(c => safeCsvCell(c.value(r)))
}
