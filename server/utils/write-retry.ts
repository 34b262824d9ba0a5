// On a Galera cluster two app servers may write the same rows through different nodes at the
// same moment. The node that certifies second aborts its transaction and reports a deadlock
// (errno 1213, "Deadlock found when trying to get lock; try restarting transaction") — at
// COMMIT or at any statement before it. A single InnoDB server reports real lock-order deadlocks
// the same way. The whole transaction was rolled back, so running it again from the start is
// safe; every write transaction of Jogwise goes through withWriteRetry for that reason.
// The work passed in must be one whole transaction whose only effects are in the database (mail
// goes through the outbox table), so a retry never does anything twice.

/**
 * Galera certification failures and brute-force aborts, and InnoDB deadlocks. Also a savepoint
 * that no longer exists (errno 1305): a brute-force abort rolls the whole transaction back at
 * once, savepoints with it, so the next ROLLBACK TO SAVEPOINT reports that in place of the
 * deadlock (seen in npm run soak:cluster). Jogwise names only savepoints it made, so the
 * transaction was undone underneath it and may be run again.
 */
const RETRYABLE_ERRNOS = new Set([1213, 1305])
const RETRYABLE_CODES = new Set(['ER_LOCK_DEADLOCK', 'ER_SP_DOES_NOT_EXIST'])

export interface WriteRetryOptions {
  /** Tries in all, the first included (default 6). */
  attempts?: number
  /** Wait before the second try; doubled each time, with full jitter (default 20 ms). */
  baseMs?: number
  /** Never wait longer than this between two tries (default 500 ms). */
  capMs?: number
  /** The random source for the jitter, for tests. */
  random?: () => number
}

/** Does this error (or one of its causes, as drizzle wraps mysql2's) ask for a retry? */
export function isWriteConflict(error: unknown): boolean {
  let e: any = error
  for (let depth = 0; e && depth < 6; depth++, e = e.cause) {
    if (RETRYABLE_ERRNOS.has(Number(e.errno)) || RETRYABLE_CODES.has(String(e.code))) return true
  }
  return false
}

/** How long to wait before try number `attempt + 1` (attempt counts from 1): full jitter. */
export function retryWaitMs(attempt: number, o: Required<Pick<WriteRetryOptions, 'baseMs' | 'capMs' | 'random'>>) {
  const ceiling = Math.min(o.capMs, o.baseMs * 2 ** Math.min(20, attempt - 1))
  return Math.floor(o.random() * ceiling)
}

let conflictsRetried = 0
/** Write conflicts retried by this process since it started (for logs and benches). */
export function writeConflictsRetried() {
  return conflictsRetried
}

/**
 * Runs `work` (one whole transaction, e.g. `() => db.transaction(async tx => …)`) and runs it
 * again when it failed with a write conflict, a bounded number of times with jittered waits so
 * two servers that collided do not collide again in step. Other errors are thrown at once.
 */
export async function withWriteRetry<T>(work: () => Promise<T>, options: WriteRetryOptions = {}): Promise<T> {
  const o = { attempts: 6, baseMs: 20, capMs: 500, random: Math.random, ...options }
  for (let attempt = 1; ; attempt++) {
    try {
      return await work()
    }
    catch (error) {
      if (attempt >= o.attempts || !isWriteConflict(error)) throw error
      conflictsRetried++
      await new Promise(resolve => setTimeout(resolve, retryWaitMs(attempt, o)))
    }
  }
}
