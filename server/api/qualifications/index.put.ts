import { z } from 'zod'
import { MAX_ID } from '#shared/schemas/input'

const BodySchema = z.object({
  userId: z.number({ error: 'userId must be a number.' }).int().positive('userId must be a positive number.').max(MAX_ID, 'userId is not a known id.'),
  procedureId: z.number({ error: 'procedureId must be a number.' }).int().positive('procedureId must be a positive number.').max(MAX_ID, 'procedureId is not a known id.'),
  qualified: z.boolean({ error: 'qualified must be true or false.' }),
}).strict()

// The owner decides who may run a procedure unsupervised.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, BodySchema)
  const db = useDB()
  // The person and the procedure, both in the owner's shop
  const [person] = await db.select({ id: tables.users.id, role: tables.users.role }).from(tables.users)
    .where(and(eq(tables.users.id, body.userId), eq(tables.users.shopId, owner.shopId))).limit(1)
  if (!person) throw notFound('person')
  await findShopProcedure(owner, body.procedureId)
  if (body.qualified && person.role === 'trainee') {
    throw invalidInput('userId', 'A trainee always runs guided; change their role to operator first.')
  }
  await withWriteRetry(() => db.transaction(async (tx) => {
    if (body.qualified) {
      // Granting twice changes nothing (the pair is unique)
      await tx.insert(tables.qualifications).values({ shopId: owner.shopId, userId: body.userId, procedureId: body.procedureId, grantedBy: owner.id })
        .onDuplicateKeyUpdate({ set: { userId: sql`user_id` } })
    }
    else {
      await tx.delete(tables.qualifications).where(and(eq(tables.qualifications.shopId, owner.shopId), eq(tables.qualifications.userId, body.userId), eq(tables.qualifications.procedureId, body.procedureId)))
    }
    await recordAudit(tx, owner, body.qualified ? 'qualification.granted' : 'qualification.removed', 'user', body.userId, { procedureId: body.procedureId })
  }))
  return body
})
