import { planSurfacing, summarizeSurfacing, surfacingGcode, SurfacingInputSchema } from '#shared/machining'

// Plans a facing on the server with the same shared code the Planner runs in the browser,
// keeps it (with the run it belongs to, when given) and answers its figures and G-code.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  const body = await readValid(event, SurfacingInputSchema)
  // Another shop's machine, run or cutter is simply not found.
  const machine = body.machineId ? await findShopMachine(user, body.machineId) : null
  if (body.runId) {
    // The run, only in this shop
    await findShopRun(user, body.runId)
  }
  // A cutter from the shop's list brings its rated speed and name: the list is the authority.
  const tool = body.toolId ? await findShopTool(user, body.toolId) : null
  const planned = tool ? { ...body, cutter: { ...body.cutter, name: tool.name, maxRpm: tool.maxRpm } } : body
  const result = planSurfacing(planned, machine
    ? {
        accelMmS2: machine.accelMmS2,
        rapidMmMin: machine.rapidMmMin,
        dwellUnit: machine.dwellUnit,
        machine: { travelXMm: machine.travelXMm, travelYMm: machine.travelYMm, travelZMm: machine.travelZMm },
      }
    : {})
  if (!result.ok) {
    throw invalidIssues(result.issues)
  }
  const summary = summarizeSurfacing(result.plan)
  const { machineId, runId, ...input } = planned
  // Keep the plan for the shop's record
  const [row] = await useDB().insert(tables.surfacingPlans).values({
    shopId: user.shopId,
    machineId: machineId ?? null,
    runId: runId ?? null,
    createdBy: user.id,
    input,
    summary,
  }).$returningId()
  setResponseStatus(event, 201)
  return { planId: row!.id, plan: summary, warnings: result.plan.warnings, gcode: surfacingGcode(result.plan) }
})
