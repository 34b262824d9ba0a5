import { z } from 'zod'
import { MAX_ID } from './input'
import { LEDGER_ENTRY_KINDS, type LedgerEntryKind } from '../runs/ledger-kinds'
import { RUN_STATUSES } from '../rules/enums'

// Filters of the Ledger (table, CSV export and run list), one copy for the screen and the API.

export { LEDGER_KIND_LABELS } from '../runs/ledger-kinds'

export const LEDGER_MAX_PAGE_SIZE = 100

const id = (label: string) => z.coerce.number({ error: `${label} must be a number.` })
  .int(`${label} must be a whole number.`).positive(`${label} must be a positive number.`).max(MAX_ID, `${label} is not a known id.`).optional()

// A day (YYYY-MM-DD, read as UTC) or a full ISO date and time with its offset.
const DAY = /^\d{4}-\d{2}-\d{2}$/
const moment = (label: string, endOfDay: boolean) => z.string({ error: `${label} must be a date.` }).trim()
  .refine(v => DAY.test(v) || /^\d{4}-\d{2}-\d{2}T/.test(v), `${label} must be a date (YYYY-MM-DD) or an ISO date and time.`)
  .transform((v, ctx) => {
    // A whole day "to" means up to the end of that day.
    const d = DAY.test(v) ? new Date(Date.parse(`${v}T00:00:00Z`) + (endOfDay ? 86_400_000 - 1 : 0)) : new Date(v)
    // A day that does not exist (30 February) would roll over into the next month; refuse it.
    const rolled = DAY.test(v) && !Number.isNaN(d.getTime()) && new Date(Date.parse(`${v}T00:00:00Z`)).toISOString().slice(0, 10) !== v
    if (Number.isNaN(d.getTime()) || rolled || d.getUTCFullYear() < 2000 || d.getUTCFullYear() > 2100) {
      ctx.addIssue({ code: 'custom', message: `${label} is not a real date between 2000 and 2100.` })
      return z.NEVER
    }
    return d
  })
  .optional()

const filterShape = {
  actorId: id('actorId'),
  machineId: id('machineId'),
  procedureId: id('procedureId'),
  from: moment('from', false),
  to: moment('to', true),
}
const page = {
  page: z.coerce.number({ error: 'page must be a number.' }).int('page must be a whole number.').min(1, 'page must be at least 1.').max(100_000, 'page must be at most 100000.').default(1),
  pageSize: z.coerce.number({ error: 'pageSize must be a number.' }).int('pageSize must be a whole number.').min(1, 'pageSize must be at least 1.')
    .max(LEDGER_MAX_PAGE_SIZE, `pageSize must be at most ${LEDGER_MAX_PAGE_SIZE}.`).default(25),
}
const fromBeforeTo = (q: { from?: Date, to?: Date }) => !q.from || !q.to || q.from <= q.to
const fromBeforeToIssue = { path: ['to'], message: 'to must not be before from.' }

export const LedgerFilterSchema = z.object({
  kind: z.enum(LEDGER_ENTRY_KINDS, { error: `kind must be one of ${LEDGER_ENTRY_KINDS.join(', ')}.` }).optional(),
  ...filterShape,
}).strict().refine(fromBeforeTo, fromBeforeToIssue)
export type LedgerFilter = z.output<typeof LedgerFilterSchema>

// The browser's IANA time zone, for the CSV's local-time column; checked by Intl itself.
const timeZone = z.string({ error: 'tz must be a time zone name.' }).trim().max(64, 'tz must be at most 64 characters.')
  .refine((v) => {
    try { new Intl.DateTimeFormat('en', { timeZone: v }); return true }
    catch { return false }
  }, 'tz must be a time zone name such as Europe/Madrid or UTC.')
  .optional()

export const LedgerExportSchema = z.object({
  kind: z.enum(LEDGER_ENTRY_KINDS, { error: `kind must be one of ${LEDGER_ENTRY_KINDS.join(', ')}.` }).optional(),
  ...filterShape,
  tz: timeZone,
}).strict().refine(fromBeforeTo, fromBeforeToIssue)
export type LedgerExport = z.output<typeof LedgerExportSchema>

export const LedgerQuerySchema = z.object({
  kind: z.enum(LEDGER_ENTRY_KINDS, { error: `kind must be one of ${LEDGER_ENTRY_KINDS.join(', ')}.` }).optional(),
  ...filterShape,
  ...page,
}).strict().refine(fromBeforeTo, fromBeforeToIssue)
export type LedgerQuery = z.output<typeof LedgerQuerySchema>

export const LedgerRunsQuerySchema = z.object({
  // A run "of a kind" has at least one Ledger entry of that kind, so the run list can follow the table.
  kind: z.enum(LEDGER_ENTRY_KINDS, { error: `kind must be one of ${LEDGER_ENTRY_KINDS.join(', ')}.` }).optional(),
  status: z.enum(RUN_STATUSES, { error: 'status must be active, finished, abandoned or withdrawn.' }).optional(),
  ...filterShape,
  ...page,
}).strict().refine(fromBeforeTo, fromBeforeToIssue)
export type LedgerRunsQuery = z.output<typeof LedgerRunsQuerySchema>

/** One line saying what an entry is about, the same on the screen and in the CSV. */
export function ledgerSummary(kind: LedgerEntryKind, detail: Record<string, unknown>): string {
  const text = summaryOf(kind, detail)
  // Entries of a run done on paper say so wherever they are read (table, record, CSV).
  return detail.fromPaper && kind !== 'entered-from-paper' ? `${text} (Entered from paper.)` : text
}

function summaryOf(kind: LedgerEntryKind, detail: Record<string, unknown>): string {
  const d = detail as Record<string, any>
  const notCounted = typeof d.notCounted === 'string' ? ` Not counted: ${d.notCounted}` : ''
  // Which language's text was on screen (issue 16); older entries have none.
  const shown = typeof d.lang === 'string' ? ` Text on screen: ${d.lang}.` : ''
  switch (kind) {
    case 'override': return `Override reason: ${d.reason ?? ''}${notCounted}`
    case 'late-past-hold': return String(d.reason ?? '')
    case 'out-of-range': return `${d.value} ${d.unit} is ${d.side} the range${d.range ? ` (${d.range})` : ''}; reason: ${d.reason ?? 'none given'}`
    case 'skipped-check': return String(d.reason ?? '')
    case 'signoff-failed': return String(d.reason ?? '')
    case 'hold-acknowledged': return `Acknowledged the ${d.signalWord ? `${d.signalWord} ` : ''}hold.${shown}${notCounted}`
    case 'signed-off': return `Signed off ${d.stepTitle ? `"${d.stepTitle}"` : 'the run'}${d.signerRole ? ` as ${d.signerRole}` : ''}.${shown}${notCounted}`
    case 'entry-changed': return String(d.reason ?? '')
    case 'backdated': return String(d.reason ?? '')
    case 'entered-from-paper': return `Run done on paper${d.ranAt ? ` on ${String(d.ranAt).slice(0, 16).replace('T', ' ')} UTC` : ''} by ${d.operatorName ?? 'the person named'}, entered ${d.enteredAt ? `on ${String(d.enteredAt).slice(0, 16).replace('T', ' ')} UTC ` : ''}by ${d.enteredByName ?? 'a trainer or the owner'}${d.sheetUploadId ? ' (photo of the sheet kept)' : ''}.`
    default: return String(d.reason ?? '')
  }
}
