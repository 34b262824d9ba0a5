import { z } from 'zod'

const ParamsSchema = z.object({ id: z.uuid() })

// One run with the exact procedure version it follows and every stored event (flags included),
// which is all a tablet needs to fold it and carry on, also on another tablet.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  const db = useDB()
  // The run, only in this shop
  const run = await findShopRun(user, id)
  const version = (await loadVersions(user.shopId, [run.procedureVersionId])).get(run.procedureVersionId)
  // The run's events in the order the server stored them
  const rows = await db.select().from(tables.runEvents).where(and(eq(tables.runEvents.runId, id), eq(tables.runEvents.shopId, user.shopId))).orderBy(asc(tables.runEvents.seq))
  // Names of everyone who acted or signed in this run, for the record
  const ids = new Set<number>([run.startedBy, ...rows.map(r => r.actorId), ...(run.enteredBy ? [run.enteredBy] : [])])
  for (const r of rows) if (typeof r.payload.signerId === 'number') ids.add(r.payload.signerId)
  const names = await db.select({ id: tables.users.id, name: tables.users.name }).from(tables.users)
    .where(and(eq(tables.users.shopId, user.shopId), inArray(tables.users.id, [...ids])))
  const { shopId: _shop, ...rest } = run
  return { run: rest, version, events: rows.map(toServerEvent), cursor: rows.at(-1)?.seq ?? 0, people: Object.fromEntries(names.map(n => [n.id, n.name])) }
})
