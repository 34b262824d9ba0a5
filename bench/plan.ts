// Planner benchmark: plan and write the program for a full 2440 x 1220 mm board with a
// 6.35 mm cutter at 40 % stepover in two passes. Run: npx tsx bench/plan.ts
import { planSurfacing } from '../shared/machining/surfacing'
import { surfacingGcode } from '../shared/machining/gcode'

const input = {
  units: 'mm',
  area: { x: 2440, y: 1220 },
  cutter: { diameter: 6.35, flutes: 2 },
  stepoverPct: 40,
  totalDepth: 0.6,
  depthPerPass: 0.3,
  feed: 2500,
  plunge: 400,
  rpm: 18000,
  direction: 'x',
  pattern: 'zigzag',
  safeZ: 5,
} as const

function once() {
  const start = performance.now()
  const result = planSurfacing(input)
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  const gcode = surfacingGcode(result.plan)
  return { ms: performance.now() - start, plan: result.plan, gcode }
}

for (let i = 0; i < 3; i++) once() // warm up the JIT
const runs = Array.from({ length: 15 }, once)
const times = runs.map(r => r.ms).sort((a, b) => a - b)
const median = times[Math.floor(times.length / 2)]!
const { plan, gcode } = runs[0]!
const lines = gcode.trimEnd().split('\n').length
const bytes = new TextEncoder().encode(gcode).length

console.log(`surfacing plan + G-code, 2440 x 1220 mm, 6.35 mm cutter, 40 % stepover, ${plan.passes.length} passes`)
console.log(`raster lines per pass: ${plan.lineCount}`)
console.log(`median of ${runs.length} runs: ${median.toFixed(2)} ms (min ${times[0]!.toFixed(2)}, max ${times.at(-1)!.toFixed(2)})`)
console.log(`G-code lines: ${lines}`)
console.log(`program size: ${bytes} bytes`)
console.log(`estimated run time: ${(plan.time.total / 60).toFixed(1)} min`)
// Last, the ratio against the aim of issue 14 (about 3.6 ms on the development machine)
console.log(`ratio median/aim: ${(median / 3.6).toFixed(2)} (median ${median.toFixed(2)} ms, aim about 3.6 ms)`)
if (median >= 100) {
  console.error('slower than the 100 ms target')
  process.exitCode = 1
}
