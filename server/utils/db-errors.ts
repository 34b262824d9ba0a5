// MariaDB's refusals as mysql2 reports them (drizzle wraps them as the `cause`).

function* causes(error: unknown) {
  let e: any = error
  for (let depth = 0; e && depth < 6; depth++, e = e.cause) yield e
}

/** A unique key refused the row; with `index`, only that index's. */
export function duplicateKey(error: unknown, index?: string) {
  for (const e of causes(error)) {
    if (e.code === 'ER_DUP_ENTRY' && (!index || String(e.sqlMessage ?? e.message ?? '').includes(index))) return true
  }
  return false
}

// A savepoint gone: the whole transaction was rolled back underneath (write-retry.ts).
const TRANSIENT_CODES = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT', 'ER_SP_DOES_NOT_EXIST'])

/** A lock wait, a deadlock or a lost connection: the same request may well succeed later. */
export function transientDatabaseError(error: unknown) {
  for (const e of causes(error)) if (TRANSIENT_CODES.has(e.code)) return true
  return !!databaseUnreachable(error)
}
