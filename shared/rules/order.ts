/**
 * Record order everywhere (the fold, the run record, the Ledger): time first, then id, so two
 * tablets that hold the same events list them the same way. UUIDv7 ids made on one tablet also
 * sort by creation time. Times are ISO strings or numbers of ms; both compare as they should.
 */
export function byTimeThenId<T extends string | number>(aTime: T, aId: string, bTime: T, bId: string): number {
  if (aTime !== bTime) return aTime < bTime ? -1 : 1
  return aId < bId ? -1 : aId > bId ? 1 : 0
}
