import { IdParamSchema } from '#shared/schemas/user'
import { ReadingBodySchema, readingToMm } from '#shared/schemas/board'

// Every role logs readings: trainees take them as part of their guided work, and each reading
// records who took it, so the owner sees whose numbers they are.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, IdParamSchema)
  const user = await requireShopUser(event)
  // Another shop's machine is 404 before its body is even read.
  const machine = await findShopMachine(user, id)
  const body = await readValid(event, ReadingBodySchema)
  if (body.machineId !== undefined && body.machineId !== id) {
    throw invalidInput('machineId', `The body names machine ${body.machineId} but the address names machine ${id}.`)
  }
  if (machine.retiredAt) {
    throw conflict(`${machine.name} is retired; bring it back before logging readings.`)
  }
  const reading = readingToMm(body)
  if (reading.runId) {
    // The run, only within the user's shop
    const run = await shopRunOrNull(user, reading.runId)
    if (!run) throw invalidInput('runId', 'No such run in this shop.')
    if (run.machineId !== id) throw invalidInput('runId', 'That run was on another machine.')
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
