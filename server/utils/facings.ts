import type { ProcedureStep } from '#shared/procedures'
import type { RunState } from '#shared/runs'
import type { DB } from './db'

const MM_PER_IN = 25.4

/**
 * A finished run with a surfacing plan step is a facing of that machine's spoilboard: store how
 * deep the attached plan cut and the thickness read afterwards (a check step about thickness),
 * once per run, so the Board history shows it.
 */
export async function recordFacing(db: DB, shopId: number, run: { id: string, machineId: number }, state: RunState, steps: readonly ProcedureStep[]) {
  if (state.status !== 'finished' || !state.finished) return
  const plannerKeys = new Set(steps.filter(s => s.kind === 'planner').map(s => s.key))
  if (!plannerKeys.size) return
  const plans = state.steps.filter(s => plannerKeys.has(s.key)).flatMap(s => s.plans)
  const planId = Number(plans.at(-1)?.planId)
  let depthMm: number | null = null
  if (Number.isInteger(planId) && planId > 0) {
    // The attached plan, in this shop
    const [plan] = await db.select({ summary: tables.surfacingPlans.summary }).from(tables.surfacingPlans)
      .where(and(eq(tables.surfacingPlans.id, planId), eq(tables.surfacingPlans.shopId, shopId))).limit(1)
    const total = Number(plan?.summary.totalDepth)
    if (Number.isFinite(total)) depthMm = plan!.summary.units === 'in' ? total * MM_PER_IN : total
  }
  const thicknessStep = steps.find(s => s.kind === 'check' && /thickness/i.test(`${s.label} ${s.title}`))
  const reading = thicknessStep ? state.steps.find(s => s.key === thicknessStep.key)?.value : null
  const unit = reading?.unit.trim().toLowerCase()
  const thicknessMm = reading && (unit === 'mm' || unit === 'in') ? (unit === 'in' ? reading.value * MM_PER_IN : reading.value) : null
  // Once per run: only the run's unique key is passed over (no INSERT IGNORE, which would also
  // store an out-of-range number as a clipped one with just a warning).
  await db.insert(tables.spoilboardFacings).values({
    shopId, machineId: run.machineId, runId: run.id, depthMm, thicknessMm, facedAt: new Date(state.finished.at),
  }).onDuplicateKeyUpdate({ set: { runId: sql`run_id` } })
}
