import { drizzle } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import * as schema from '../database/schema'

export { and, asc, count, desc, eq, gt, gte, inArray, isNull, isNotNull, lt, lte, ne, or, sql } from 'drizzle-orm'

export const tables = schema

let pool: mysql.Pool | undefined
let db: ReturnType<typeof drizzle<typeof schema>> | undefined

/** One lazy mysql2 pool per server process, configured from NUXT_DB_* runtime config. */
export function useDB() {
  if (!db) {
    const { db: cfg } = useRuntimeConfig()
    pool = mysql.createPool({
      host: cfg.host,
      port: Number(cfg.port),
      user: cfg.user,
      password: cfg.password,
      database: cfg.name,
      connectionLimit: 10,
      // Timestamps are stored and read as UTC whatever the machine's zone.
      timezone: 'Z',
      dateStrings: false,
    })
    db = drizzle(pool, { schema, mode: 'default' })
  }
  return db
}

export type DB = ReturnType<typeof useDB>

export async function closeDB() {
  await pool?.end()
  pool = undefined
  db = undefined
}
