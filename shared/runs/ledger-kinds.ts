// Every kind of Ledger entry, in one place: the database enum (server/database/schema.ts), the
// API's kind filter, the screen's labels and the CSV all read this list. To add a kind, add it
// here with its label and its summary (shared/schemas/ledger.ts), then generate a migration.

export const LEDGER_ENTRY_KINDS = [
  'override',
  'late-past-hold',
  'out-of-range',
  'skipped-check',
  'hold-acknowledged',
  'signed-off',
  // An earlier entry whose meaning a later-arriving event changed (the old entry stays).
  'entry-changed',
  // An event dated well before events other tablets had already delivered for its run.
  'backdated',
  // A sign-off whose sealed PIN or password failed the server's check at merge (kept, not counted).
  'signoff-failed',
  // A run done on a printed sheet and entered afterwards by a trainer or the owner.
  'entered-from-paper',
] as const
export type LedgerEntryKind = typeof LEDGER_ENTRY_KINDS[number]

/** Readable names, the same on the screen and in the CSV. */
export const LEDGER_KIND_LABELS: Record<LedgerEntryKind, string> = {
  'override': 'Hold overridden',
  'late-past-hold': 'Went past a hold',
  'out-of-range': 'Reading out of range',
  'skipped-check': 'Check skipped',
  'hold-acknowledged': 'Hold acknowledged',
  'signed-off': 'Signed off',
  'entry-changed': 'Earlier entry changed',
  'backdated': 'Dated before delivered events',
  'signoff-failed': 'Sign-off failed its check',
  'entered-from-paper': 'Entered from paper',
}
