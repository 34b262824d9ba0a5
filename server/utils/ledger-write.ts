import { ledgerEntriesOf, spindleMinutesOf, type LedgerEntryDraft, type RunState } from '#shared/runs'
import type { ProcedureStep } from '#shared/procedures/schema'

// Keeps ledger_entries and runs.spindle_minutes equal to what the fold says, for the runs a
// sync batch touched: new entries are inserted, entries no longer true (an undone reading) are
// deleted, changed details rewritten. Called by refoldRuns inside the merge transaction.

export interface FoldedRun {
  run: { id: string, machineId: number }
  procedureId: number
  state: RunState
  steps: readonly ProcedureStep[]
}

// Key-sorted JSON, so a detail read back from the database compares equal to a fresh one.
function stable(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stable).join(',')}]`
  if (value !== null && typeof value === 'object') {
    return `{${Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : 1)).map(([k, v]) => `${JSON.stringify(k)}:${stable(v)}`).join(',')}}`
  }
  return JSON.stringify(value) ?? 'null'
}

export async function writeRunLedger(db: DB, shopId: number, folded: FoldedRun[]) {
  if (!folded.length) return
  const runIds = folded.map(f => f.run.id)

  // Estimated machine minutes of the plans these runs attached, in this shop
  const planIds = [...new Set(folded.flatMap(f => f.state.steps.flatMap(s => s.plans.map(p => Number(p.planId)))))]
    .filter(n => Number.isInteger(n) && n > 0)
  const planMinutes = new Map<string, number>()
  if (planIds.length) {
    const plans = await db.select({ id: tables.surfacingPlans.id, summary: tables.surfacingPlans.summary }).from(tables.surfacingPlans)
      .where(and(eq(tables.surfacingPlans.shopId, shopId), inArray(tables.surfacingPlans.id, planIds)))
    for (const p of plans) {
      const seconds = Number(p.summary.totalSeconds)
      if (Number.isFinite(seconds)) planMinutes.set(String(p.id), seconds / 60)
    }
  }

  // The entries these runs have now
  const existing = await db.select({
    id: tables.ledgerEntries.id, runId: tables.ledgerEntries.runId, eventId: tables.ledgerEntries.eventId, kind: tables.ledgerEntries.kind,
    actorId: tables.ledgerEntries.actorId, stepKey: tables.ledgerEntries.stepKey, at: tables.ledgerEntries.at, detail: tables.ledgerEntries.detail,
  }).from(tables.ledgerEntries).where(and(eq(tables.ledgerEntries.shopId, shopId), inArray(tables.ledgerEntries.runId, runIds)))
  const have = new Map(existing.map(r => [`${r.eventId}:${r.kind}`, r]))

  const inserts: (typeof tables.ledgerEntries.$inferInsert)[] = []
  const keep = new Set<number>()
  for (const f of folded) {
    const entries: LedgerEntryDraft[] = ledgerEntriesOf(f.state, f.steps)
    for (const e of entries) {
      const row = {
        shopId, eventId: e.eventId, runId: f.run.id, kind: e.kind, actorId: e.actorId, machineId: f.run.machineId,
        procedureId: f.procedureId, stepKey: e.stepKey, at: new Date(e.at), detail: e.detail,
      }
      const old = have.get(`${e.eventId}:${e.kind}`)
      if (!old) {
        inserts.push(row)
        continue
      }
      keep.add(old.id)
      if (old.actorId !== row.actorId || old.stepKey !== row.stepKey || old.at.getTime() !== row.at.getTime() || stable(old.detail) !== stable(row.detail)) {
        await db.update(tables.ledgerEntries).set({ actorId: row.actorId, stepKey: row.stepKey, at: row.at, detail: row.detail })
          .where(eq(tables.ledgerEntries.id, old.id))
      }
    }
    const minutes = spindleMinutesOf(f.state, f.steps, id => planMinutes.get(id) ?? null)
    await db.update(tables.runs).set({ spindleMinutes: minutes }).where(eq(tables.runs.id, f.run.id))
  }
  const gone = existing.filter(r => !keep.has(r.id)).map(r => r.id)
  if (gone.length) await db.delete(tables.ledgerEntries).where(inArray(tables.ledgerEntries.id, gone))
  // ignore(): two merges folding the same run at once may both try to add the same entry
  if (inserts.length) await db.insert(tables.ledgerEntries).ignore().values(inserts)
}
