import { ProcedurePublishSchema } from '#shared/schemas/procedure'
import { LEAD_ROLES } from '#shared/types/roles'

// A new procedure, published as version 1.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  const { procedure, changeNote } = await readValid(event, ProcedurePublishSchema)
  const db = useDB()
  const base = procedure.title.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'procedure'
  // Slugs already used in this shop that start like this one
  const taken = new Set((await db.select({ slug: tables.procedures.slug }).from(tables.procedures)
    .where(and(eq(tables.procedures.shopId, user.shopId), sql`${tables.procedures.slug} like ${`${base}%`}`))).map(r => r.slug))
  let slug = base
  for (let n = 2; taken.has(slug); n++) slug = `${base}-${n}`
  const result = await withWriteRetry(() => db.transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.procedures).values({ shopId: user.shopId, slug, category: procedure.category }).$returningId() as [{ id: number }]
    const published = await publishVersion(tx, { shopId: user.shopId, procedureId: id, procedure, createdBy: user.id, changeNote: changeNote ?? 'First version' })
    await recordAudit(tx, user, 'procedure.published', 'procedure', id, { version: published.version })
    return { id, ...published }
  }))
  setResponseStatus(event, 201)
  return result
})
