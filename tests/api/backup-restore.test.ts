import { execFile } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync } from 'node:fs'
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join, relative, resolve } from 'node:path'
import { promisify } from 'node:util'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { v7 as uuidv7 } from 'uuid'
import { makePng } from '../support/images'
import { as, BASE_URL, call, db } from './client'

// npm run backup and npm run restore FILE against the suite's own MariaDB: the backup of the
// test database (demo shop, everything the API tests made, one fresh photo) is restored into a
// brand-new database and photo folder, then both sides are compared table by table — row
// counts, MariaDB's CHECKSUM TABLE, and a sha256 over every row in primary-key order — and
// photo by photo with sha256.

const run = promisify(execFile)
const ROOT = resolve(import.meta.dirname, '../..')
const SOURCE_DB = process.env.NUXT_DB_NAME || 'jogwise_test'
// Root of the suite's MariaDB answers on its socket only (scripts/db.sh); scripts/test.sh exports it.
const ROOT_SOCKET = process.env.JOGWISE_TEST_DB_SOCKET || join(ROOT, '.data/mariadb-test/mariadb.sock')
// Where the running server keeps photos (scripts/test.sh sets NUXT_UPLOADS_DIR to .data/test-uploads).
const SOURCE_UPLOADS = process.env.NUXT_UPLOADS_DIR || join(ROOT, '.data/uploads')
const TARGET_DB = `jogwise_restore_${Date.now()}`

let work: string
let photo: { key: string, sha256: string }

const asRoot = (sqlText: string) => run('mariadb', ['--no-defaults', `--socket=${ROOT_SOCKET}`, '-uroot', '-e', sqlText])

async function script(name: 'backup' | 'restore', args: string[], env: Record<string, string>) {
  try {
    const { stdout, stderr } = await run('bash', [`scripts/${name}.sh`, ...args], { cwd: ROOT, env: { ...process.env, ...env } })
    return { code: 0, stdout, stderr }
  }
  catch (error: any) {
    return { code: error.code as number, stdout: String(error.stdout), stderr: String(error.stderr) }
  }
}

interface TableSum { rows: number, checksum: string, rowHash: string }

/** Rows, CHECKSUM TABLE and an ordered sha256 of every base table in one database. */
async function snapshot(schema: string): Promise<Record<string, TableSum>> {
  const [tables] = await db().query<any[]>(
    'select table_name as name from information_schema.tables where table_schema = ? and table_type = ? order by table_name', [schema, 'BASE TABLE'])
  const out: Record<string, TableSum> = {}
  for (const { name } of tables) {
    const [keys] = await db().query<any[]>(
      'select column_name as col from information_schema.key_column_usage where table_schema = ? and table_name = ? and constraint_name = ? order by ordinal_position',
      [schema, name, 'PRIMARY'])
    const order = keys.length ? `order by ${keys.map(k => `\`${k.col}\``).join(', ')}` : ''
    // CHECKSUM TABLE: MariaDB's own live checksum of the table's rows (MariaDB docs, CHECKSUM TABLE).
    const [[sum]] = await db().query<any[]>(`checksum table \`${schema}\`.\`${name}\``)
    // sha256 over each row in key order (FIPS 180-4, node:crypto), independent of the server's checksum.
    const [rows] = await db().query({ sql: `select * from \`${schema}\`.\`${name}\` ${order}`, rowsAsArray: true })
    const hash = createHash('sha256')
    for (const row of rows as unknown[][]) hash.update(JSON.stringify(row)).update('\n')
    out[name] = { rows: (rows as unknown[]).length, checksum: String(sum.Checksum), rowHash: hash.digest('hex') }
  }
  return out
}

async function filesUnder(dir: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {}
  if (!existsSync(dir)) return out
  for (const entry of await readdir(dir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile() || entry.name.endsWith('.part')) continue
    const full = join(entry.parentPath, entry.name)
    out[relative(dir, full)] = createHash('sha256').update(await readFile(full)).digest('hex')
  }
  return out
}

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'jogwise-backup-test-'))
  // A fresh database the jogwise user may fill, as an operator would prepare one.
  await asRoot(`CREATE DATABASE \`${TARGET_DB}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci; GRANT ALL PRIVILEGES ON \`${TARGET_DB}\`.* TO 'jogwise'@'127.0.0.1';`)

  // One photo through the API, so the photo folder is not empty.
  const operator = await as('operator')
  const me = (await call('GET', '/api/me', { cookie: operator })).body.user
  const machineId = (await call('GET', '/api/machines', { cookie: operator })).body[0].id
  const version = (await call('GET', '/api/procedures', { cookie: operator })).body.find((p: any) => p.slug === 'daily-start-up').current
  const runId = uuidv7()
  const started = await call('POST', '/api/sync', { cookie: operator, body: { deviceId: 'backup-check', events: [{
    id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: me.id, deviceId: 'backup-check',
    procedureVersionId: version.id, machineId, mode: 'guided',
  }] } })
  expect(started.body.accepted).toHaveLength(1)
  const png = makePng(24, 16, Date.now() & 0xFF)
  const uploadId = uuidv7()
  const res = await fetch(`${BASE_URL}/api/uploads/${uploadId}?runId=${runId}`, { method: 'PUT', headers: { 'cookie': operator, 'content-type': 'image/png' }, body: png })
  expect(res.status).toBeLessThan(300)
  const [[row]] = await db().query<any[]>('select storage_key as storageKey from uploads where id = ?', [uploadId])
  photo = { key: row.storageKey, sha256: createHash('sha256').update(png).digest('hex') }
}, 60_000)

afterAll(async () => {
  await asRoot(`DROP DATABASE IF EXISTS \`${TARGET_DB}\``).catch(() => {})
  await rm(work, { recursive: true, force: true })
  await db().end()
})

describe('npm run backup, then npm run restore FILE into a fresh database', () => {
  it('gives back every table row for row and every photo byte for byte', async () => {
    const backupDir = join(work, 'backups')
    // The suite's server keeps running while the backup is made. A backup whose source did not
    // change meanwhile is compared exactly; only the mail worker's outbox may keep changing (a
    // mail still being retried) and its lease row (renewed every tick), and then those tables
    // are held to the manifest's row count.
    let file = ''
    let source: Record<string, TableSum> = {}
    let moving: string[] = []
    const alwaysMoving = (t: string) => t === 'mail_outbox' || t === 'worker_leases'
    for (let attempt = 0; attempt < 4; attempt++) {
      const before = await snapshot(SOURCE_DB)
      const made = await script('backup', [], { JOGWISE_BACKUP_DIR: backupDir, NUXT_UPLOADS_DIR: SOURCE_UPLOADS })
      expect(made.code, made.stderr).toBe(0)
      const after = await snapshot(SOURCE_DB)
      file = made.stdout.trim().split('\n').at(-1)!
      source = after
      moving = Object.keys(after).filter(t => JSON.stringify(before[t]) !== JSON.stringify(after[t]))
      if (moving.every(alwaysMoving)) break
    }
    expect(moving.filter(t => !alwaysMoving(t)), 'tables that changed during every backup').toEqual([])
    expect(file).toMatch(/jogwise-\d{8}T\d{6}Z(-\d+)?\.tar\.gz$/)
    expect(existsSync(file)).toBe(true)

    // The manifest counts exactly the source's rows.
    const { stdout: manifestText } = await run('tar', ['-xzOf', file, 'manifest.json'])
    const manifest = JSON.parse(manifestText)
    expect(manifest.format).toBe('jogwise-backup')
    const steady = (sums: Record<string, TableSum>) => Object.fromEntries(Object.entries(sums).filter(([t]) => !moving.includes(t)))
    expect(Object.keys(manifest.database.tables).sort()).toEqual(Object.keys(source).sort())
    for (const [t, sum] of Object.entries(steady(source))) expect(manifest.database.tables[t], t).toBe(sum.rows)
    expect(source.run_events!.rows).toBeGreaterThan(0)

    const restoredUploads = join(work, 'restored-uploads')
    const restored = await script('restore', [file], { JOGWISE_RESTORE_DB_NAME: TARGET_DB, NUXT_UPLOADS_DIR: restoredUploads })
    expect(restored.code, restored.stderr).toBe(0)
    expect(restored.stdout).toContain(`database ${TARGET_DB} restored and checked`)
    const copy = await snapshot(TARGET_DB)
    expect(steady(copy)).toEqual(steady(source))
    for (const t of moving) expect(copy[t]!.rows, t).toBe(manifest.database.tables[t])

    // Photos: the one sent above by its own sha256, and every restored file equal to its source.
    const back = await filesUnder(restoredUploads)
    expect(back[photo.key]).toBe(photo.sha256)
    // The archive's own list names exactly the restored files; photos never change once stored,
    // so each must still equal its source (other servers may add photos to a shared folder).
    const { stdout: list } = await run('tar', ['-xzOf', file, 'uploads.sha256'])
    expect(Object.keys(back).sort()).toEqual(list.trim().split('\n').map(l => l.slice(66).replace(/^\.\//, '')).sort())
    const original = await filesUnder(SOURCE_UPLOADS)
    for (const [key, sha] of Object.entries(back)) expect(sha, key).toBe(original[key])

    // Restoring again over the restored copy gives the same result.
    const again = await script('restore', [file], { JOGWISE_RESTORE_DB_NAME: TARGET_DB, NUXT_UPLOADS_DIR: restoredUploads })
    expect(again.code, again.stderr).toBe(0)
    expect(await snapshot(TARGET_DB)).toEqual(copy)
    expect(await filesUnder(restoredUploads)).toEqual(back)
  }, 180_000)

  it('refuses a missing, foreign or cut-short file in plain words and leaves the database alone', async () => {
    const before = await snapshot(TARGET_DB)
    const env = { JOGWISE_RESTORE_DB_NAME: TARGET_DB, NUXT_UPLOADS_DIR: join(work, 'refused-uploads') }
    const missing = await script('restore', [join(work, 'no-such-backup.tar.gz')], env)
    const foreign = join(work, 'notes.tar.gz')
    await writeFile(foreign, 'these are not the droids')
    const notOurs = await script('restore', [foreign], env)
    const full = await readFile((await readdir(join(work, 'backups'))).map(f => join(work, 'backups', f)).find(f => f.endsWith('.tar.gz'))!)
    const cut = join(work, 'cut.tar.gz')
    await writeFile(cut, full.subarray(0, Math.floor(full.length / 2)))
    const cutShort = await script('restore', [cut], env)
    const none = await script('restore', [], env)
    for (const [answer, words] of [[missing, 'no such backup file'], [notOurs, 'is not a Jogwise backup'], [cutShort, cut], [none, 'usage: npm run restore FILE']] as const) {
      expect(answer.code).not.toBe(0)
      expect(answer.stderr).toContain(words)
      expect(answer.stderr).not.toMatch(/\n\s+at /) // no stack trace
    }
    expect(existsSync(env.NUXT_UPLOADS_DIR)).toBe(false)
    expect(await snapshot(TARGET_DB)).toEqual(before)
  }, 30_000)
})
