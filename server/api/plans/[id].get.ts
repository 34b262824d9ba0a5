import { z } from 'zod'
import { MAX_ID } from '#shared/schemas/input'
import { planSurfacing, surfacingGcode, upgradeStoredInput } from '#shared/machining'

const ParamsSchema = z.object({ id: z.coerce.number().int().positive().max(MAX_ID) })

// A stored plan with its program written again from the stored input, so a fix to the G-code
// writer reaches old plans too. The travel check already passed when it was stored.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  // The plan, only in this shop
  const [row] = await useDB().select({
    id: tables.surfacingPlans.id,
    machineId: tables.surfacingPlans.machineId,
    runId: tables.surfacingPlans.runId,
    createdBy: tables.surfacingPlans.createdBy,
    input: tables.surfacingPlans.input,
    summary: tables.surfacingPlans.summary,
    createdAt: tables.surfacingPlans.createdAt,
  }).from(tables.surfacingPlans)
    .where(and(eq(tables.surfacingPlans.id, id), eq(tables.surfacingPlans.shopId, user.shopId))).limit(1)
  if (!row) throw notFound('plan')
  // The machine's motion settings give the program header the same time estimate as before.
  const [machine] = row.machineId
    ? await useDB().select({ accelMmS2: tables.machines.accelMmS2, rapidMmMin: tables.machines.rapidMmMin, dwellUnit: tables.machines.dwellUnit })
        .from(tables.machines).where(and(eq(tables.machines.id, row.machineId), eq(tables.machines.shopId, user.shopId))).limit(1)
    : []
  const result = planSurfacing(upgradeStoredInput(row.input), machine ?? {})
  if (!result.ok) {
    // Only if the planner's rules grew stricter since the plan was stored.
    throw conflict('This stored plan no longer passes the planner\'s checks; plan it again.', result.issues)
  }
  return { ...row, gcode: surfacingGcode(result.plan) }
})
