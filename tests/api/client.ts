import mysql from 'mysql2/promise'
import { v7 as uuidv7 } from 'uuid'
import { DEMO, DEMO_PASSWORD, type DemoRole } from '../demo'

export { DEMO, DEMO_PASSWORD, type DemoRole }

// Plain HTTP against the built server that scripts/test.sh started, and a direct connection to
// the suite's own MariaDB database for arranging cross-shop data and checking rows.
export const BASE_URL = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'

export interface Answer<T = any> { status: number, body: T, text: string }

export async function call<T = any>(method: string, path: string, opts: { cookie?: string, body?: unknown, raw?: string, headers?: Record<string, string> } = {}): Promise<Answer<T>> {
  const res = await fetch(BASE_URL + path, {
    method,
    headers: {
      ...(opts.cookie ? { cookie: opts.cookie } : {}),
      ...(opts.body !== undefined || opts.raw !== undefined ? { 'content-type': 'application/json' } : {}),
      accept: 'application/json',
      ...opts.headers,
    },
    body: opts.raw ?? (opts.body !== undefined ? JSON.stringify(opts.body) : undefined),
  })
  const text = await res.text()
  let body: any
  try { body = text ? JSON.parse(text) : undefined }
  catch { body = undefined }
  return { status: res.status, body, text }
}

export async function signIn(email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await fetch(BASE_URL + '/api/auth/login', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  })
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`)
  const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  return cookie
}

const sessions = new Map<string, string>()
export async function as(role: DemoRole) {
  if (!sessions.has(role)) sessions.set(role, await signIn(DEMO[role]))
  return sessions.get(role)!
}

let pool: mysql.Pool | undefined
export function db() {
  pool ??= mysql.createPool({
    host: process.env.NUXT_DB_HOST || '127.0.0.1',
    port: Number(process.env.NUXT_DB_PORT || 3418),
    user: process.env.NUXT_DB_USER || 'jogwise',
    password: process.env.NUXT_DB_PASSWORD || 'jogwise-local',
    database: process.env.NUXT_DB_NAME || 'jogwise_test',
    timezone: 'Z',
  })
  return pool
}

/**
 * A second, separate shop with one owner, for cross-shop checks. The owner's password hash is
 * made by the server itself: a helper user is created through the API, and its hash copied.
 */
export async function otherShop() {
  const email = `owner-${Date.now()}@other.jogwise.test`
  const password = 'other-shop-password'
  const made = await call('POST', '/api/users', { cookie: await as('owner'), body: { name: 'Hash Donor', email: `donor-${Date.now()}@demo.jogwise.test`, role: 'operator', password } })
  if (made.status !== 201) throw new Error(`could not create the donor user: ${made.text}`)
  const [[donor]] = await db().query<any[]>('select password_hash from users where id = ?', [made.body.id])
  await db().query('update users set active = 0 where id = ?', [made.body.id])
  const [shop] = await db().query<any>('insert into shops (name, units) values (?, ?)', ['Second Test Shop', 'mm'])
  const shopId = shop.insertId as number
  await db().query('insert into users (shop_id, email, name, password_hash, role) values (?, ?, ?, ?, ?)', [shopId, email, 'Other Owner', donor.password_hash, 'owner'])
  const [machine] = await db().query<any>(
    'insert into machines (shop_id, name, travel_x_mm, travel_y_mm, travel_z_mm, units, spindle_kind, has_length_sensor, spoilboard_material, spoilboard_nominal_mm, spoilboard_min_mm) values (?,?,?,?,?,?,?,?,?,?,?)',
    [shopId, 'Other Router', 600, 600, 100, 'mm', 'trim-router', 0, 'MDF', 18, 12],
  )
  const [[owner]] = await db().query<any[]>('select id from users where email = ?', [email])
  const [proc] = await db().query<any>('insert into procedures (shop_id, slug, category) values (?, ?, ?)', [shopId, 'other-procedure', 'daily'])
  const [version] = await db().query<any>('insert into procedure_versions (shop_id, procedure_id, version, title, summary) values (?, ?, 1, ?, ?)', [shopId, proc.insertId, 'Other procedure', 'A procedure of another shop.'])
  await db().query('update procedures set current_version_id = ? where id = ?', [version.insertId, proc.insertId])
  const runId = uuidv7()
  await db().query('insert into runs (id, shop_id, machine_id, procedure_version_id, started_by, mode, started_at) values (?, ?, ?, ?, ?, ?, now(3))', [runId, shopId, machine.insertId, version.insertId, owner.id, 'solo'])
  return { shopId, machineId: machine.insertId as number, procedureId: proc.insertId as number, versionId: version.insertId as number, runId, cookie: await signIn(email, password) }
}
