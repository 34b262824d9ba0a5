import { execFileSync } from 'node:child_process'
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'

// scripts/lib.sh `build_is_stale`, run by bash against a copy of the script in a scratch
// checkout, so ROOT is that folder. File times are set outright: no waiting on the clock.
const root = mkdtempSync(join(tmpdir(), 'jogwise-stale-'))
mkdirSync(join(root, 'scripts'))
copyFileSync(join(__dirname, '../../scripts/lib.sh'), join(root, 'scripts/lib.sh'))
const BUILT = new Date('2026-01-10T08:00:00Z')
const before = new Date('2026-01-09T08:00:00Z')
const after = new Date('2026-01-11T08:00:00Z')

function file(path: string, at: Date) {
  const full = join(root, path)
  mkdirSync(dirname(full), { recursive: true })
  writeFileSync(full, '// source\n')
  utimesSync(full, at, at)
}
function stale(): boolean {
  const script = `source "${join(root, 'scripts/lib.sh')}"; if build_is_stale "${join(root, 'out')}"; then echo stale; else echo fresh; fi`
  return execFileSync('bash', ['-c', script], { encoding: 'utf8' }).trim() === 'stale'
}

afterAll(() => rmSync(root, { recursive: true, force: true }))

describe('build_is_stale', () => {
  it('wants a build when there is none, and none when every source is older', () => {
    expect(stale()).toBe(true)
    file('out/nitro.json', BUILT)
    file('pages/index.vue', before)
    file('utils/backoff.ts', before)
    expect(stale()).toBe(false)
  })

  it.each(['utils/backoff.ts', 'error.vue', 'app.vue', 'layouts/default.vue', 'middleware/auth.global.ts', 'server/api/health.get.ts', 'shared/runs/fold.ts', 'i18n/locales/es.json'])(
    'rebuilds after %s changes', (path) => {
      file('out/nitro.json', BUILT)
      file(path, after)
      expect(stale()).toBe(true)
      file(path, before)
      expect(stale()).toBe(false)
    },
  )

  it('ignores files outside the app (tests, docs)', () => {
    file('out/nitro.json', BUILT)
    file('tests/unit/some.test.ts', after)
    file('DEVELOPERS.md', after)
    expect(stale()).toBe(false)
  })
})
