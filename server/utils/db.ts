import { sql } from 'drizzle-orm'
import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import * as schema from '../database/schema'

export { and, asc, count, desc, eq, gt, gte, inArray, isNull, isNotNull, lt, lte, ne, or, sql } from 'drizzle-orm'

export const tables = schema

let pool: mysql.Pool | undefined
// The promise pool's database; drizzle's own return type names the callback pool's overload.
let db: MySql2Database<typeof schema> | undefined
// The pool whose connections may send several statements at once (useStatementsAtOnce)
let batchPool: mysql.Pool | undefined
let poolOptions: mysql.PoolOptions | undefined

/** The pools' settings, from NUXT_DB_* runtime config; both pools share one node choice (db-nodes). */
function options(): mysql.PoolOptions {
  if (poolOptions) return poolOptions
  const { db: cfg } = useRuntimeConfig()
  const nodes = parseDbHosts(String(cfg.host ?? ''), Number(cfg.port) || 3306)
  const socket = String(cfg.socket ?? '')
  poolOptions = {
    host: nodes[0]!.host,
    port: nodes[0]!.port,
    // Several nodes (a Galera cluster): each new connection goes to the node in use (db-nodes)
    ...(nodes.length > 1 && { stream: nodeStream(nodes) }),
    // One MariaDB on this machine: its Unix socket spares every statement the loopback TCP path (issue 14)
    ...(nodes.length === 1 && socket && { socketPath: socket }),
    user: cfg.user,
    password: cfg.password,
    database: cfg.name,
    connectionLimit: 10,
    // Timestamps are stored and read as UTC whatever the machine's zone.
    timezone: 'Z',
    dateStrings: false,
    // mysql2's own formatting, except that a statement with no values is sent as it is: the
    // default scans the whole text for placeholders even then, and a sync batch's INSERT is
    // written (escaped) before it is sent, some 100 KB scanned a second time (issue 14).
    queryFormat: (statement: string, values: unknown) =>
      values === undefined || (Array.isArray(values) && values.length === 0) ? statement : mysql.format(statement, values as never, false, 'Z'),
  }
  return poolOptions
}

/** One lazy mysql2 pool per server process, configured from NUXT_DB_* runtime config. */
export function useDB() {
  if (!db) {
    pool = mysql.createPool(options())
    db = drizzle(pool, { schema, mode: 'default' })
  }
  return db
}

// Timestamps as drizzle reads them: UTC text (utcTimestamp), on its connections and ours alike
const typeCast: mysql.TypeCast = (field, next) =>
  field.type === 'TIMESTAMP' || field.type === 'DATETIME' || field.type === 'DATE' ? field.string() : next()

/** A connection of the several-statements pool, for one transaction (useStatementsAtOnce). */
export interface StatementsConnection {
  /** Sends these statements, written and escaped already, in one round trip: the result of each, in order. MariaDB stops at the first that fails (the promise fails with its error). */
  send: (statements: string[]) => Promise<unknown[]>
  /** The same connection as drizzle's database, for the statements between. */
  db: DB
}
const drizzleOf = new WeakMap<object, DB>()

/**
 * Runs `work` on a connection that may send several statements in one round trip: a sync batch
 * that starts its run opens its transaction with its writes and closes it with the last ones
 * (sync.ts, issue 14: each round trip cost about a millisecond). Only statements written with
 * mysql2's escaping go through it, and it is a pool of its own, so no other route's connection
 * accepts more than one statement at a time. What `work` leaves open is rolled back.
 */
export async function useStatementsAtOnce<T>(work: (connection: StatementsConnection) => Promise<T>): Promise<T> {
  batchPool ??= mysql.createPool({ ...options(), multipleStatements: true })
  const connection = await batchPool.getConnection()
  const own = drizzleOf.get(connection.connection) ?? drizzle(connection as never, { schema, mode: 'default' }) as unknown as DB
  drizzleOf.set(connection.connection, own)
  const send = async (statements: string[]) => {
    const [results] = await connection.query({ sql: statements.join(';\n'), typeCast })
    // One statement gives its result alone, several an array of them
    return statements.length === 1 ? [results] : results as unknown[]
  }
  try {
    const result = await work({ send, db: own })
    connection.release()
    return result
  }
  catch (error) {
    // Whatever the work left open is undone; a connection that cannot even do that is dropped.
    try {
      await connection.query('rollback')
      connection.release()
    }
    catch {
      connection.destroy()
    }
    throw error
  }
}

export type DB = ReturnType<typeof useDB>

/**
 * A statement written with mysql2's own escaping, on this pool or a transaction: its rows (or,
 * for a write, its result). For hot statements, where drizzle's builder took longer to write
 * the statement than MariaDB to answer it (issue 14). Timestamps come back as UTC text (utcTimestamp).
 */
export async function queryEscaped<T>(db: DB, statement: string, values: Parameters<typeof mysql.format>[1]): Promise<T[]> {
  const [rows] = await db.execute(sql.raw(mysql.format(statement, values))) as unknown as [T[]]
  return rows
}

/**
 * Runs a drizzle write now, or, given `deferred`, adds it there as the text mysql2 would send
 * for it (the same escaping as our pools' queryFormat), for the caller to send with others
 * (useStatementsAtOnce).
 */
export async function writeNowOrDefer(query: PromiseLike<unknown> & { toSQL: () => { sql: string, params: unknown[] } }, deferred?: string[]) {
  if (!deferred) return void await query
  const { sql: text, params } = query.toSQL()
  deferred.push(mysql.format(text, params as never, false, 'Z'))
}

/** A timestamp as a raw read on drizzle's connection returns it: UTC text, 'YYYY-MM-DD HH:MM:SS.mmm' (drizzle reads its own columns the same way). */
export const utcTimestamp = (text: string) => new Date(`${text}+0000`)
/** What db.transaction hands its callback (a savepoint's too). */
export type Tx = Parameters<Parameters<DB['transaction']>[0]>[0]

export async function closeDB() {
  await Promise.all([pool?.end(), batchPool?.end()])
  pool = undefined
  batchPool = undefined
  db = undefined
  poolOptions = undefined
}

// mysql2 error codes that mean "MariaDB is not there just now" (stopped, restarting, too busy),
// as opposed to a bad query. mysql2 also marks such connection-level errors `fatal`.
const UNREACHABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND',
  'PROTOCOL_CONNECTION_LOST', 'PROTOCOL_SEQUENCE_TIMEOUT', 'ER_CON_COUNT_ERROR',
  'ER_SERVER_SHUTDOWN', 'ER_CONNECTION_KILLED', 'ER_QUERY_INTERRUPTED',
  // A Galera node that is not (yet) part of the primary component or still catching up answers
  // every query with 1047 "WSREP has not yet prepared node for application use".
  'ER_UNKNOWN_COM_ERROR',
  // A write conflict still there after withWriteRetry's tries: the cluster is busy; try later.
  'ER_LOCK_DEADLOCK',
])

/**
 * The mysql2 error behind an error (drizzle wraps them as the `cause`) when it says the database
 * could not be reached, else null. The pool drops such connections itself and opens new ones
 * once MariaDB is back, so the server recovers without a restart.
 */
export function databaseUnreachable(error: unknown): { code: string } | null {
  let e: any = error
  for (let depth = 0; e && depth < 6; depth++, e = e.cause) {
    const code = typeof e.code === 'string' ? e.code : ''
    if (UNREACHABLE_CODES.has(code)) return { code }
    if (depth > 0 && e.fatal === true) return { code: code || 'FATAL' }
    if (/Can't add new command when connection is in closed state|Pool is closed/.test(String(e.message ?? ''))) return { code: code || 'CONNECTION_CLOSED' }
  }
  return null
}
