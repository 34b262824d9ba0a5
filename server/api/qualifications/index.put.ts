import { z } from 'zod'

const BodySchema = z.object({
  userId: z.number({ error: 'userId must be a number.' }).int().positive('userId must be a positive number.'),
  procedureId: z.number({ error: 'procedureId must be a number.' }).int().positive('procedureId must be a positive number.'),
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
    throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'userId: a trainee always runs guided; change their role to operator first.', data: { issues: [{ path: 'userId', message: 'A trainee always runs guided; change their role to operator first.' }] } })
  }
  if (body.qualified) {
    await db.insert(tables.qualifications).ignore().values({ shopId: owner.shopId, userId: body.userId, procedureId: body.procedureId, grantedBy: owner.id })
  }
  else {
    await db.delete(tables.qualifications).where(and(eq(tables.qualifications.shopId, owner.shopId), eq(tables.qualifications.userId, body.userId), eq(tables.qualifications.procedureId, body.procedureId)))
  }
  await recordAudit(owner, body.qualified ? 'qualification.granted' : 'qualification.removed', 'user', body.userId, { procedureId: body.procedureId })
  return body
})
