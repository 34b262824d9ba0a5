import { storedTitlesIn } from '#shared/procedures'

// The maintenance due list: for every interval (procedure × machine, or × every machine in
// service when machine_id is null) when it was last done and whether it is due again.
// An interval is satisfied by the last FINISHED run of that procedure on that machine; never
// done yet counts from when the machine was added (a machine added today is not overdue; one
// added long ago and never serviced is). Spindle hours since = the spindle minutes of runs on
// that machine started after that run finished (runs.spindle_minutes, kept by the sync merge) / 60.

export type DueStatus = 'ok' | 'due' | 'overdue'

export interface DueItem {
  intervalId: number
  procedureId: number
  procedureTitle: string
  machineId: number
  machineName: string
  status: DueStatus
  /** In English, for mail and CSV; screens write it from the facts below in the reader's language. */
  reason: string
  /** Whole days since it was last done, or since the machine was added; null when neither is known. */
  daysSince: number | null
  lastDoneAt: string | null
  dueAt: string | null
  spindleHoursSince: number | null
  everyDays: number | null
  everySpindleHours: number | null
}

const DAY_MS = 86_400_000
// 'due' starts a little before the limit so there is time to plan the work: 10 % of the
// interval, but at least one day (a weekly task shows the day before, a 90-day one 9 days before).
// Spindle hours use 10 % alone: there is no natural "one day" of spindle time.
export const DUE_WINDOW_SHARE = 0.1
export const DUE_WINDOW_MIN_DAYS = 1

const STATUS_RANK: Record<DueStatus, number> = { ok: 0, due: 1, overdue: 2 }

export interface IntervalFacts {
  everyDays: number | null
  everySpindleHours: number | null
  lastDoneAt: Date | null
  /** When the machine was added: the start of the count while the procedure was never done on it. */
  addedAt?: Date | null
  spindleHoursSince: number
}

/** The status of one interval from its facts; pure, so the rule is testable on its own. */
export function dueStatusOf(f: IntervalFacts, now: Date): { status: DueStatus, reason: string, dueAt: Date | null, daysSince: number | null } {
  const since = f.lastDoneAt ?? f.addedAt ?? null
  const daysSince = since ? Math.floor((now.getTime() - since.getTime()) / DAY_MS) : null
  if (!since) {
    const every = [f.everyDays ? `every ${f.everyDays} days` : '', f.everySpindleHours ? `every ${f.everySpindleHours} spindle hours` : ''].filter(Boolean).join(' or ')
    return { status: 'overdue', reason: `Never done; ${every}.`, dueAt: null, daysSince }
  }
  let status: DueStatus = 'ok'
  const reasons: string[] = []
  let dueAt: Date | null = null
  if (f.everyDays) {
    dueAt = new Date(since.getTime() + f.everyDays * DAY_MS)
    const windowMs = Math.max(DUE_WINDOW_MIN_DAYS, f.everyDays * DUE_WINDOW_SHARE) * DAY_MS
    const left = dueAt.getTime() - now.getTime()
    const days = daysSince!
    const s: DueStatus = left < 0 ? 'overdue' : left <= windowMs ? 'due' : 'ok'
    if (STATUS_RANK[s] > STATUS_RANK[status]) status = s
    reasons.push(`${f.lastDoneAt ? 'last done' : 'not done yet; machine added'} ${days} day${days === 1 ? '' : 's'} ago, every ${f.everyDays} days`)
  }
  if (f.everySpindleHours) {
    const h = f.spindleHoursSince
    const s: DueStatus = h > f.everySpindleHours ? 'overdue' : h >= f.everySpindleHours * (1 - DUE_WINDOW_SHARE) ? 'due' : 'ok'
    if (STATUS_RANK[s] > STATUS_RANK[status]) status = s
    reasons.push(`${f.lastDoneAt || f.everyDays ? '' : 'not done yet; '}${round1(h)} of ${f.everySpindleHours} spindle hours used`)
  }
  const text = reasons.join('; ')
  return { status, reason: text.charAt(0).toUpperCase() + text.slice(1) + '.', dueAt, daysSince }
}

function round1(n: number) {
  return Math.round(n * 10) / 10
}

/**
 * Every interval of the shop on every machine it applies to, worst first; procedure titles in
 * `lang` where the current version has a translation.
 */
export async function listDueItems(shopId: number, now = new Date(), lang = 'en'): Promise<DueItem[]> {
  const db = useDB()
  const t = tables
  // The shop's intervals with their procedure's current title
  const intervals = await db.select({
    id: t.maintenanceIntervals.id, procedureId: t.maintenanceIntervals.procedureId, machineId: t.maintenanceIntervals.machineId,
    everyDays: t.maintenanceIntervals.everyDays, everySpindleHours: t.maintenanceIntervals.everySpindleHours,
    title: t.procedureVersions.title, translations: t.procedureVersions.translations,
  }).from(t.maintenanceIntervals)
    .innerJoin(t.procedures, eq(t.procedures.id, t.maintenanceIntervals.procedureId))
    .leftJoin(t.procedureVersions, eq(t.procedureVersions.id, t.procedures.currentVersionId))
    .where(eq(t.maintenanceIntervals.shopId, shopId))
    .orderBy(asc(t.maintenanceIntervals.id))
  if (!intervals.length) return []
  // The shop's machines in service
  const machines = await db.select({ id: t.machines.id, name: t.machines.name, createdAt: t.machines.createdAt }).from(t.machines)
    .where(and(eq(t.machines.shopId, shopId), isNull(t.machines.retiredAt)))
    .orderBy(asc(t.machines.name))
  // Last finished run per machine and procedure (one grouped query for the whole shop)
  const procedureIds = [...new Set(intervals.map(i => i.procedureId))]
  const lastRows = await db.select({
    machineId: t.runs.machineId, procedureId: t.procedureVersions.procedureId,
    at: sql<string>`max(${t.runs.finishedAt})`.mapWith(v => (v ? new Date(v instanceof Date ? v : `${String(v).replace(' ', 'T')}Z`) : null)),
  }).from(t.runs)
    .innerJoin(t.procedureVersions, eq(t.procedureVersions.id, t.runs.procedureVersionId))
    .where(and(eq(t.runs.shopId, shopId), eq(t.runs.status, 'finished'), inArray(t.procedureVersions.procedureId, procedureIds)))
    .groupBy(t.runs.machineId, t.procedureVersions.procedureId)
  const lastDone = new Map(lastRows.map(r => [`${r.machineId}:${r.procedureId}`, r.at as Date | null]))
  // Spindle time per machine since a given moment: one small sum per interval that counts hours
  const spindleSince = async (machineId: number, since: Date | null) => {
    const [row] = await db.select({ m: sql<string>`coalesce(sum(${t.runs.spindleMinutes}), 0)` }).from(t.runs)
      .where(and(eq(t.runs.shopId, shopId), eq(t.runs.machineId, machineId), since ? gt(t.runs.startedAt, since) : undefined))
    return Number(row?.m ?? 0) / 60
  }

  const out: DueItem[] = []
  for (const i of intervals) {
    const title = storedTitlesIn(i.translations, lang).procedure(i.title ?? `Procedure ${i.procedureId}`)
    for (const m of machines.filter(m => i.machineId === null || m.id === i.machineId)) {
      const lastDoneAt = lastDone.get(`${m.id}:${i.procedureId}`) ?? null
      const spindleHoursSince = i.everySpindleHours ? await spindleSince(m.id, lastDoneAt) : 0
      const { status, reason, dueAt, daysSince } = dueStatusOf({ everyDays: i.everyDays, everySpindleHours: i.everySpindleHours, lastDoneAt, addedAt: m.createdAt, spindleHoursSince }, now)
      out.push({
        intervalId: i.id, procedureId: i.procedureId, procedureTitle: title,
        machineId: m.id, machineName: m.name, status, reason, daysSince,
        lastDoneAt: lastDoneAt?.toISOString() ?? null, dueAt: dueAt?.toISOString() ?? null,
        spindleHoursSince: i.everySpindleHours ? round1(spindleHoursSince) : null,
        everyDays: i.everyDays, everySpindleHours: i.everySpindleHours,
      })
    }
  }
  return out.sort((a, b) => STATUS_RANK[b.status] - STATUS_RANK[a.status] || a.machineName.localeCompare(b.machineName) || a.procedureTitle.localeCompare(b.procedureTitle))
}
