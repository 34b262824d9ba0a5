import { z } from 'zod'
import { MAX_ID } from './input'
import { LEDGER_ENTRY_KINDS, type LedgerEntryKind } from '../runs/ledger'

// Filters of the Ledger (table, CSV export and run list), one copy for the screen and the API.

export const LEDGER_KIND_LABELS: Record<LedgerEntryKind, string> = {
  'override': 'Hold overridden',
  'late-past-hold': 'Went past a hold',
  'out-of-range': 'Reading out of range',
  'skipped-check': 'Check skipped',
  'signoff-failed': 'Sign-off failed its check',
}

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

export const LedgerQuerySchema = z.object({
  kind: z.enum(LEDGER_ENTRY_KINDS, { error: `kind must be one of ${LEDGER_ENTRY_KINDS.join(', ')}.` }).optional(),
  ...filterShape,
  ...page,
}).strict().refine(fromBeforeTo, fromBeforeToIssue)
export type LedgerQuery = z.output<typeof LedgerQuerySchema>

export const LedgerRunsQuerySchema = z.object({
  status: z.enum(['active', 'finished', 'abandoned'], { error: 'status must be active, finished or abandoned.' }).optional(),
  ...filterShape,
  ...page,
}).strict().refine(fromBeforeTo, fromBeforeToIssue)
export type LedgerRunsQuery = z.output<typeof LedgerRunsQuerySchema>

/** One line saying what an entry is about, the same on the screen and in the CSV. */
export function ledgerSummary(kind: LedgerEntryKind, detail: Record<string, unknown>): string {
  const d = detail as Record<string, any>
  switch (kind) {
    case 'override': return `Override reason: ${d.reason ?? ''}`
    case 'late-past-hold': return String(d.reason ?? '')
    case 'out-of-range': return `${d.value} ${d.unit} is ${d.side} the range${d.range ? ` (${d.range})` : ''}; reason: ${d.reason ?? 'none given'}`
    case 'skipped-check': return String(d.reason ?? '')
    case 'signoff-failed': return String(d.reason ?? '')
  }
}
