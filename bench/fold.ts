import { foldRun } from '../shared/runs/fold'
import { ROLES, TRAINER } from '../tests/unit/runs/fixtures'
import { longLog, steps } from './fold-log'

// npm run bench:fold — Jogwise's own budget: a tablet re-folds the whole log on every tap and
// the server folds a run on every sync batch, so 10,000 events must fold well under 50 ms.
// The machine may be shared, so wall time mostly measures waiting for a core: the fold's cost is
// its CPU time, and the fastest of several runs is the fairest figure.
const events = longLog(10_000)
const roles = { ...ROLES, [TRAINER]: 'trainer' as const }
for (let i = 0; i < 10; i++) foldRun(steps, events, { roles }) // let the JIT settle
const cpu: number[] = []
const wall: number[] = []
for (let i = 0; i < 30; i++) {
  const c = process.cpuUsage()
  const t = performance.now()
  foldRun(steps, events, { roles })
  wall.push(performance.now() - t)
  const d = process.cpuUsage(c)
  cpu.push((d.user + d.system) / 1000)
}
cpu.sort((a, b) => a - b)
wall.sort((a, b) => a - b)
console.log(`fold of 10,000 events: CPU fastest ${cpu[0]!.toFixed(1)} ms, median ${cpu[15]!.toFixed(1)} ms; wall fastest ${wall[0]!.toFixed(1)} ms, median ${wall[15]!.toFixed(1)} ms`)
console.log(`aim: under 50 ms CPU — ${cpu[0]! < 50 ? 'met' : 'NOT met'} (ratio ${(cpu[0]! / 50).toFixed(2)} of the budget)`)
