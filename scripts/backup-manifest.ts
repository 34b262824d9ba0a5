// The manifest of a Jogwise backup (npm run backup / npm run restore): written, checked and
// compared with the restored database here, in checked TypeScript, so the shell scripts only
// move files. Each command prints one line for the script or dies with a plain reason.
//   backup-manifest.ts write <work-dir> <database> <app-version> <commit>
//   backup-manifest.ts check <manifest.json>           → "<createdAt>\t<version>\t<database>"
//   backup-manifest.ts count-sql <manifest.json>       → one SELECT counting every table's rows
//   backup-manifest.ts verify <manifest.json> <counts> → "<n> tables, <rows> rows"
import { readFileSync, statSync, writeFileSync } from 'node:fs'
import { pathToFileURL } from 'node:url'

export interface BackupManifest {
  format: 'jogwise-backup'
  formatVersion: 1
  createdAt: string
  app: { name: 'jogwise', version: string, commit: string }
  database: { name: string, tables: Record<string, number> }
  uploads: { files: number, bytes: number }
}

/** "table count" lines (from the dump's INSERT lines) into a map. */
export function parseCounts(text: string, separator: string | RegExp = ' '): Record<string, number> {
  return Object.fromEntries(text.trim().split('\n').filter(Boolean).map((line) => {
    const [table, n] = line.split(separator)
    return [table!, Number(n)]
  }))
}

/** Why a manifest cannot be used, or null. */
export function manifestProblem(m: unknown): string | null {
  const x = m as Partial<BackupManifest> | null
  if (x?.format !== 'jogwise-backup') return 'manifest.json is not a Jogwise backup manifest'
  if (x.formatVersion !== 1) return `backup format version ${String(x.formatVersion)} is not one this Jogwise reads (1)`
  const t = x.database?.tables
  if (!t || typeof t !== 'object' || !Object.values(t).every(n => Number.isInteger(n) && n >= 0)) return 'manifest.json has no row counts'
  const strange = Object.keys(t).find(name => !/^[A-Za-z0-9_]+$/.test(name))
  if (strange !== undefined) return `manifest.json names a strange table: ${strange}`
  return null
}

/** One query that counts the rows of every table the manifest names (names checked above). */
export const countSql = (m: BackupManifest) =>
  Object.keys(m.database.tables).sort().map(t => `SELECT "${t}", COUNT(*) FROM \`${t}\``).join(' UNION ALL ') || 'SELECT 1, 1 FROM DUAL WHERE 0'

/** Tables whose restored row count differs from the backup's, with both numbers. */
export function countMismatches(want: Record<string, number>, got: Record<string, number>): string[] {
  return Object.keys(want).filter(t => got[t] !== want[t]).map(t => `${t}: ${got[t] ?? 'missing'} rows, the backup has ${want[t]}`)
}

const totalRows = (tables: Record<string, number>) => Object.values(tables).reduce((a, b) => a + b, 0)

function die(message: string): never {
  console.error(message)
  process.exit(1)
}

function readManifest(path: string): BackupManifest {
  let m: unknown
  try { m = JSON.parse(readFileSync(path, 'utf8')) }
  catch { die('manifest.json is not JSON') }
  const problem = manifestProblem(m)
  if (problem) die(problem)
  return m as BackupManifest
}

function main([command, ...args]: string[]) {
  switch (command) {
    case 'write': {
      const [dir, database, version, commit] = args as [string, string, string, string]
      const tables = parseCounts(readFileSync(`${dir}/counts.txt`, 'utf8'))
      const sums = readFileSync(`${dir}/uploads.sha256`, 'utf8').trim().split('\n').filter(Boolean)
      // sha256sum lines: 64 hex digits, two spaces, then "./name"
      const bytes = sums.reduce((total, line) => total + statSync(`${dir}/uploads/${line.slice(66)}`).size, 0)
      const manifest: BackupManifest = {
        format: 'jogwise-backup', formatVersion: 1, createdAt: new Date().toISOString(),
        app: { name: 'jogwise', version, commit }, database: { name: database, tables }, uploads: { files: sums.length, bytes },
      }
      writeFileSync(`${dir}/manifest.json`, `${JSON.stringify(manifest, null, 2)}\n`)
      console.log(`${Object.keys(tables).length} tables, ${totalRows(tables)} rows, ${sums.length} photos`)
      break
    }
    case 'check': {
      const m = readManifest(args[0]!)
      console.log([m.createdAt, m.app?.version, m.database.name].join('\t'))
      break
    }
    case 'count-sql':
      console.log(countSql(readManifest(args[0]!)))
      break
    case 'verify': {
      const want = readManifest(args[0]!).database.tables
      const bad = countMismatches(want, parseCounts(readFileSync(args[1]!, 'utf8'), '\t'))
      if (bad.length) die(bad.map(line => `  ${line}`).join('\n'))
      console.log(`${Object.keys(want).length} tables, ${totalRows(want)} rows`)
      break
    }
    default:
      die(`unknown command ${JSON.stringify(command)}: write, check, count-sql or verify`)
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main(process.argv.slice(2))
