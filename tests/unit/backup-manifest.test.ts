import { describe, expect, it } from 'vitest'
import { countMismatches, countSql, manifestProblem, parseCounts, type BackupManifest } from '../../scripts/backup-manifest'

// The backup manifest's rules, without MariaDB (tests/api/backup-restore.test.ts runs the real
// npm run backup and npm run restore end to end).

const good: BackupManifest = {
  format: 'jogwise-backup', formatVersion: 1, createdAt: '2026-12-03T08:00:00.000Z',
  app: { name: 'jogwise', version: '0.1.0', commit: 'abc1234' },
  database: { name: 'jogwise', tables: { run_events: 12, shops: 1 } },
  uploads: { files: 0, bytes: 0 },
}

describe('backup manifest', () => {
  it('reads the per-table counts the dump produced, and the tab-separated counts MariaDB prints', () => {
    expect(parseCounts('run_events 12\nshops 1\n')).toEqual({ run_events: 12, shops: 1 })
    expect(parseCounts('run_events\t12\nshops\t1', '\t')).toEqual({ run_events: 12, shops: 1 })
    expect(parseCounts('')).toEqual({})
  })

  it('accepts its own format and says why it refuses anything else', () => {
    expect(manifestProblem(good)).toBeNull()
    expect(manifestProblem(null)).toBe('manifest.json is not a Jogwise backup manifest')
    expect(manifestProblem({ ...good, formatVersion: 2 })).toBe('backup format version 2 is not one this Jogwise reads (1)')
    expect(manifestProblem({ ...good, database: { name: 'x', tables: { shops: -1 } } })).toBe('manifest.json has no row counts')
    expect(manifestProblem({ ...good, database: { name: 'x', tables: { 'shops`; DROP TABLE users; --': 1 } } })).toMatch(/strange table/)
  })

  it('counts every named table in one query, and lists each table whose rows differ', () => {
    expect(countSql(good)).toBe('SELECT "run_events", COUNT(*) FROM `run_events` UNION ALL SELECT "shops", COUNT(*) FROM `shops`')
    expect(countSql({ ...good, database: { name: 'x', tables: {} } })).toBe('SELECT 1, 1 FROM DUAL WHERE 0')
    expect(countMismatches(good.database.tables, { run_events: 12, shops: 1 })).toEqual([])
    expect(countMismatches(good.database.tables, { run_events: 11 })).toEqual([
      'run_events: 11 rows, the backup has 12',
      'shops: missing rows, the backup has 1',
    ])
  })
})
