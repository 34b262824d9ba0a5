import { describe, expect, it } from 'vitest'
import { isWriteConflict, retryWaitMs, withWriteRetry } from '../../../server/utils/write-retry'

// Galera reports a failed certification as MariaDB error 1213 ER_LOCK_DEADLOCK (MariaDB
// Knowledge Base, "MariaDB Galera Cluster - Known Limitations": "a transaction may fail ...
// with a deadlock error at commit"); mysql2 puts it on the error as errno/code, and drizzle
// wraps it as the `cause` of its own error.
const deadlock = () => Object.assign(new Error('Deadlock found when trying to get lock; try restarting transaction'), { errno: 1213, code: 'ER_LOCK_DEADLOCK' })
const wrapped = (cause: Error) => Object.assign(new Error('Failed query: commit'), { cause })

describe('withWriteRetry', () => {
  it('recognises a deadlock, also under drizzle\'s wrapper, and nothing else', () => {
    expect(isWriteConflict(deadlock())).toBe(true)
    expect(isWriteConflict(wrapped(deadlock()))).toBe(true)
    // After a brute-force abort the transaction's savepoints are gone with it: the next
    // ROLLBACK TO SAVEPOINT answers 1305 (MariaDB error codes, ER_SP_DOES_NOT_EXIST; seen in
    // npm run soak:cluster in place of the deadlock)
    expect(isWriteConflict(wrapped(Object.assign(new Error('SAVEPOINT sp1 does not exist'), { errno: 1305, code: 'ER_SP_DOES_NOT_EXIST' })))).toBe(true)
    expect(isWriteConflict(Object.assign(new Error('Duplicate entry'), { errno: 1062, code: 'ER_DUP_ENTRY' }))).toBe(false)
    expect(isWriteConflict(new Error('plain'))).toBe(false)
    expect(isWriteConflict(undefined)).toBe(false)
  })

  it('runs the work again after a conflict and returns its result', async () => {
    let calls = 0
    const result = await withWriteRetry(async () => {
      calls++
      if (calls < 3) throw wrapped(deadlock())
      return 'stored'
    }, { baseMs: 1, random: () => 0.5 })
    expect(result).toBe('stored')
    expect(calls).toBe(3)
  })

  it('gives up after the bounded number of tries and throws the conflict', async () => {
    let calls = 0
    await expect(withWriteRetry(async () => { calls++; throw deadlock() }, { attempts: 4, baseMs: 1, random: () => 0 }))
      .rejects.toMatchObject({ errno: 1213 })
    expect(calls).toBe(4)
  })

  it('throws any other error at once, without a second try', async () => {
    let calls = 0
    await expect(withWriteRetry(async () => { calls++; throw new Error('bad query') })).rejects.toThrow('bad query')
    expect(calls).toBe(1)
  })

  it('waits a jittered, doubling, capped time (full jitter)', () => {
    // "Exponential Backoff And Jitter", AWS Architecture Blog (2015): sleep = random(0, min(cap, base * 2^attempt))
    const o = { baseMs: 20, capMs: 500 }
    expect(retryWaitMs(1, { ...o, random: () => 0.999 })).toBe(19)
    expect(retryWaitMs(2, { ...o, random: () => 0.5 })).toBe(20)
    expect(retryWaitMs(3, { ...o, random: () => 0.5 })).toBe(40)
    expect(retryWaitMs(10, { ...o, random: () => 0.999 })).toBe(499)
    expect(retryWaitMs(10, { ...o, random: () => 0 })).toBe(0)
  })
})
