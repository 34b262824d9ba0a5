import { IdParamSchema } from '#shared/schemas/user'
import { ReadingBodySchema, readingToMm } from '#shared/schemas/board'

function invalidField(path: string, message: string) {
  return createError({ statusCode: 400, statusMessage: 'Invalid input', message: `${path}: ${message}`, data: { issues: [{ path, message }] } })
}

// Every role logs readings: trainees take them as part of their guided work, and each reading
// records who took it, so the owner sees whose numbers they are.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  // Another shop's machine is 404 before its body is even read.
  const machine = await findShopMachine(user, id)
  const body = await readValid(event, ReadingBodySchema)
  if (body.machineId !== undefined && body.machineId !== id) {
    throw invalidField('machineId', `The body names machine ${body.machineId} but the address names machine ${id}.`)
  }
  if (machine.retiredAt) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${machine.name} is retired; bring it back before logging readings.` })
  }
  const reading = readingToMm(body)
  if (reading.runId) {
    // The run, only within the user's shop
    const [run] = await useDB().select({ machineId: tables.runs.machineId }).from(tables.runs)
      .where(and(eq(tables.runs.id, reading.runId), eq(tables.runs.shopId, user.shopId))).limit(1)
    if (!run) throw invalidField('runId', 'No such run in this shop.')
    if (run.machineId !== id) throw invalidField('runId', 'That run was on another machine.')
  }
  // A new reading on this machine, taken by the signed-in person
  const readingId = await withWriteRetry(() => useDB().transaction(async (tx) => {
    const [{ id: readingId }] = await tx.insert(tables.spoilboardReadings).values({
      ...reading, shopId: user.shopId, machineId: id, takenBy: user.id,
    }).$returningId() as [{ id: number }]
    await recordAudit(tx, user, 'board.reading', 'machine', id, { readingId, kind: reading.kind, rows: reading.grid.length, cols: reading.grid[0]!.length })
    return readingId
  }))
  setResponseStatus(event, 201)
  return (await loadBoardHistory(user, machine)).find(r => r.id === readingId)!
})
