import { z } from 'zod'
import { LEDGER_KIND_LABELS, ledgerSummary } from '#shared/schemas/ledger'
import { isLeadRole } from '#shared/types/roles'
import { storedTitlesIn } from '#shared/procedures'

const ParamsSchema = z.object({ id: z.uuid() })

// What the record shows beside the fold: when the server received each event (next to the time
// the tablet claimed), and for owner and trainer the run's Ledger entries, changed ones
// included, so "Record" from a Ledger row can open the run at that entry.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  const db = useDB()
  // The run, only in this shop
  const run = await findShopRun(user, id)
  // Arrival time of each of the run's events
  const events = await db.select({ id: tables.runEvents.id, receivedAt: tables.runEvents.receivedAt }).from(tables.runEvents)
    .where(and(eq(tables.runEvents.runId, id), eq(tables.runEvents.shopId, user.shopId)))
  const received = Object.fromEntries(events.map(e => [e.id, e.receivedAt.toISOString()]))
  if (!isLeadRole(user.role)) return { received, entries: null }
  const l = tables.ledgerEntries
  // The run's Ledger entries, oldest first, with the person's name
  const rows = await db.select({
    id: l.id, eventId: l.eventId, kind: l.kind, at: l.at, receivedAt: l.receivedAt, counted: l.counted, revision: l.revision,
    changedAt: l.changedAt, changedBy: l.changedBy, stepKey: l.stepKey, detail: l.detail, actorId: l.actorId, actorName: tables.users.name,
  }).from(l).innerJoin(tables.users, eq(tables.users.id, l.actorId))
    .where(and(eq(l.shopId, user.shopId), eq(l.runId, id))).orderBy(asc(l.at), asc(l.id))
  // The step titles inside the entries in the reader's language, as the record shows the steps
  const lang = callerLanguage(event)
  const [version] = await db.select({ translations: tables.procedureVersions.translations })
    .from(tables.procedureVersions).where(eq(tables.procedureVersions.id, run.procedureVersionId)).limit(1)
  const titles = storedTitlesIn(version?.translations, lang)
  const withTitle = (stepKey: string | null, detail: Record<string, unknown>) =>
    stepKey && typeof detail.stepTitle === 'string' ? { ...detail, stepTitle: titles.step(stepKey, detail.stepTitle) } : detail
  return {
    received,
    entries: rows.map(r => ({
      id: r.id, eventId: r.eventId, kind: r.kind, kindLabel: LEDGER_KIND_LABELS[r.kind], at: r.at.toISOString(),
      receivedAt: r.receivedAt?.toISOString() ?? null, counted: r.counted, revision: r.revision,
      changedAt: r.changedAt?.toISOString() ?? null, changedBy: r.changedBy, stepKey: r.stepKey,
      actorId: r.actorId, actorName: r.actorName, summary: ledgerSummary(r.kind, withTitle(r.stepKey, r.detail ?? {})),
    })),
  }
})
