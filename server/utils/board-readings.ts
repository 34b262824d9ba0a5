import { summarizeHistory, type BoardMachine } from '#shared/schemas/board'
import type { ShopUser } from './authz'

/**
 * A machine's spoilboard readings with their analysis, newest first. Every reading is read,
 * because a height reading's thickness estimate follows the facings recorded before it.
 */
export async function loadBoardHistory(user: ShopUser, machine: BoardMachine & { id: number }) {
  // The machine's readings with the name of who took each, only within the user's shop
  const rows = await useDB().select({
    id: tables.spoilboardReadings.id,
    takenAt: tables.spoilboardReadings.takenAt,
    takenById: tables.spoilboardReadings.takenBy,
    takenByName: tables.users.name,
    kind: tables.spoilboardReadings.kind,
    grid: tables.spoilboardReadings.grid,
    spacingXMm: tables.spoilboardReadings.spacingXMm,
    spacingYMm: tables.spoilboardReadings.spacingYMm,
    runId: tables.spoilboardReadings.runId,
    facedDepthMm: tables.spoilboardReadings.facedDepthMm,
    note: tables.spoilboardReadings.note,
  }).from(tables.spoilboardReadings)
    .innerJoin(tables.users, eq(tables.users.id, tables.spoilboardReadings.takenBy))
    .where(and(eq(tables.spoilboardReadings.shopId, user.shopId), eq(tables.spoilboardReadings.machineId, machine.id)))
  return summarizeHistory(machine, rows)
}
