import type { DueItem } from './due-list'
import { dueReasonText } from '#shared/rules/due-reason'

// The owner's daily digest: the last 24 hours' skipped checks and out-of-range readings from
// the Ledger, and what maintenance is due or overdue. One mail per active owner, shop and day;
// the dedupe key makes a second enqueue the same day a no-op.

/** The server's calendar day as YYYY-MM-DD (the digest hour is server time too). */
export function localDay(d: Date): string {
  const p = (n: number) => String(n).padStart(2, '0')
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}`
}

const when = (d: Date) => `${localDay(d)} ${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`

interface DigestLine { at: Date, kind: string, runId: string, machine: string, procedure: string, step: string, person: string, detail: Record<string, unknown> }

type Say = (key: string, values?: Record<string, string | number>) => string

function describe(detail: Record<string, unknown>, m: Say, lang: string, tag: string): string {
  const parts: string[] = []
  const value = detail.value ?? detail.reading
  const unit = detail.unit ? ` ${detail.unit}` : ''
  const shown = typeof value === 'number' ? new Intl.NumberFormat(tag, { maximumFractionDigits: 6, useGrouping: false }).format(value) : value
  if (value !== undefined && value !== null) parts.push(m('reading', { value: `${shown}${unit}` }))
  // The Ledger writes the allowed range as text (describeRange); min/max are read too.
  if (typeof detail.range === 'string' && detail.range) parts.push(m('allowed', { range: detail.range }))
  else if (detail.min !== undefined || detail.max !== undefined) {
    parts.push(m('allowed', { range: messageIn(lang, 'range.between', { min: String(detail.min ?? '…'), max: String(detail.max ?? '…'), unit: String(detail.unit ?? '') }).trim() }))
  }
  if (typeof detail.reason === 'string' && detail.reason) parts.push(m('reason', { reason: detail.reason }))
  return parts.join(', ')
}

/** What goes into one shop's digest for the 24 hours before `now`. */
export async function digestContent(shopId: number, now: Date) {
  const db = useDB()
  const since = new Date(now.getTime() - 24 * 3600_000)
  // The Ledger's skipped checks and out-of-range readings of the last day, with the names of
  // the machine, person, procedure version and step they concern
  const rows = await db.select({
    at: tables.ledgerEntries.at, kind: tables.ledgerEntries.kind, runId: tables.ledgerEntries.runId,
    stepKey: tables.ledgerEntries.stepKey, detail: tables.ledgerEntries.detail,
    machine: tables.machines.name, person: tables.users.name,
    procedure: tables.procedureVersions.title, step: tables.procedureSteps.title,
  }).from(tables.ledgerEntries)
    .innerJoin(tables.machines, eq(tables.machines.id, tables.ledgerEntries.machineId))
    .innerJoin(tables.users, eq(tables.users.id, tables.ledgerEntries.actorId))
    .leftJoin(tables.runs, eq(tables.runs.id, tables.ledgerEntries.runId))
    .leftJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.runs.procedureVersionId))
    .leftJoin(tables.procedureSteps, and(eq(tables.procedureSteps.versionId, tables.runs.procedureVersionId), eq(tables.procedureSteps.key, tables.ledgerEntries.stepKey)))
    .where(and(
      eq(tables.ledgerEntries.shopId, shopId),
      inArray(tables.ledgerEntries.kind, ['skipped-check', 'out-of-range']),
      // Only entries still true: one the record later changed has a newer revision or none.
      isNull(tables.ledgerEntries.changedAt),
      gte(tables.ledgerEntries.at, since), lte(tables.ledgerEntries.at, now),
    ))
    .orderBy(asc(tables.ledgerEntries.at))
  const lines: DigestLine[] = rows.map(r => ({
    at: r.at, kind: r.kind, runId: r.runId, machine: r.machine, person: r.person,
    procedure: r.procedure ?? 'procedure', detail: r.detail ?? {},
    step: r.step ?? (typeof r.detail?.stepTitle === 'string' ? r.detail.stepTitle : null) ?? r.stepKey ?? 'step',
  }))
  const due: DueItem[] = (await listDueItems(shopId, now)).filter(d => d.status !== 'ok')
  return {
    since,
    skipped: lines.filter(l => l.kind === 'skipped-check'),
    outOfRange: lines.filter(l => l.kind === 'out-of-range'),
    // listDueItems gives the worst first.
    due,
  }
}

/** The digest's text in `lang` (each owner reads it in their own language, the `mail.digest` section). */
export function digestText(shopName: string, now: Date, c: Awaited<ReturnType<typeof digestContent>>, lang = 'en'): string {
  const site = siteUrl()
  const m: Say = (key, values = {}) => messageIn(lang, `mail.digest.${key}`, values)
  const tag = messageIn(lang, 'meta.tag')
  const entry = (l: DigestLine) => {
    const extra = describe(l.detail, m, lang, tag)
    return `- ${when(l.at)} · ${l.machine} · ${l.procedure} · "${l.step}" · ${l.person}${extra ? ` · ${extra}` : ''}\n  ${site}/runs/${l.runId}/record`
  }
  const section = (title: string, items: string[]) => `${title} (${items.length})\n${items.length ? items.join('\n') : `- ${m('none')}`}`
  return [
    m('intro', { shop: shopName, day: localDay(now), from: when(c.since), to: when(now) }),
    section(m('skipped'), c.skipped.map(entry)),
    section(m('outOfRange'), c.outOfRange.map(entry)),
    section(m('due'), c.due.map(d => `- ${messageIn(lang, d.status === 'overdue' ? 'due.overdue' : 'due.due')} · ${d.machineName} · ${d.procedureTitle} · ${dueReasonText(d, (key, values, count) => messageIn(lang, `dueList.reason.${key}`, values, count), (n, fraction) => new Intl.NumberFormat(tag, { maximumFractionDigits: fraction ?? 6 }).format(n))}`)),
    m('ledger', { link: `${site}/ledger` }),
    messageIn(lang, 'safety.note'),
  ].join('\n\n')
}

/** Queues today's digest of one shop to each active owner; returns how many mails were new. */
export async function enqueueShopDigest(shopId: number, now = new Date()): Promise<{ day: string, queued: number, owners: number }> {
  const db = useDB()
  const day = localDay(now)
  // The shop's name
  const [shop] = await db.select({ name: tables.shops.name }).from(tables.shops).where(eq(tables.shops.id, shopId)).limit(1)
  if (!shop) return { day, queued: 0, owners: 0 }
  const owners = await activeOwners(db, shopId)
  if (!owners.length) return { day, queued: 0, owners: 0 }
  const content = await digestContent(shopId, now)
  let queued = 0
  for (const owner of owners) {
    // Each owner reads the digest in their own language (server/utils/language.ts).
    const lang = owner.language ?? 'en'
    const text = digestText(shop.name, now, content, lang)
    const counts = { day, skipped: content.skipped.length, outOfRange: content.outOfRange.length, due: content.due.length }
    const subject = messageIn(lang, 'mail.digest.subject', counts)
    const added = await enqueueMail(db, { shopId, kind: 'digest', dedupeKey: `digest:${shopId}:${day}:${owner.id}`, to: owner.email, subject, text })
    if (added) queued++
  }
  return { day, queued, owners: owners.length }
}

let doneForDay = ''
const DIGEST_LEASE = 'daily-digest'
// Long enough for every shop's digest to be queued by one server.
const DIGEST_LEASE_MS = 10 * 60_000

/**
 * Called by the outbox worker: after the digest hour, each shop's digest once per day, by one
 * app server of the cluster (the holder of the `daily-digest` lease row, which also records the
 * day done). The dedupe keys still make a second enqueue a no-op.
 */
export async function enqueueDigestsWhenDue(now = new Date()) {
  const day = localDay(now)
  if (doneForDay === day || now.getHours() < mailSettings().digestHour) return
  if (await leaseDoneFor(DIGEST_LEASE) === day) { doneForDay = day; return }
  if (!await claimLease(DIGEST_LEASE, DIGEST_LEASE_MS, now)) return
  // Another server may have finished the day between the look and the claim.
  if (await leaseDoneFor(DIGEST_LEASE) !== day) {
    // Every shop
    const shops = await useDB().select({ id: tables.shops.id }).from(tables.shops)
    for (const shop of shops) {
      // One shop's digest that cannot be queued is an error in the log, never a shorter mail,
      // and does not keep the other shops from theirs.
      try { await enqueueShopDigest(shop.id, now) }
      catch (error) {
        if (transientDatabaseError(error)) throw error
        console.error(`[jogwise] daily digest of shop ${shop.id} not queued:`, error instanceof Error ? error.message : error)
      }
    }
    await markLeaseDone(DIGEST_LEASE, day)
  }
  doneForDay = day
  await releaseLease(DIGEST_LEASE)
}
