import { z } from 'zod'
import { SignoffVerifySchema } from '#shared/schemas/sync'

const ParamsSchema = z.object({ id: z.uuid() })

// A trainer or owner proves who they are on the trainee's tablet (their PIN or password). The
// answer carries a proof that the sign-off event takes with it, also through the offline queue.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  // The run, only in this shop
  const [run] = await useDB().select({ id: tables.runs.id }).from(tables.runs).where(and(eq(tables.runs.id, id), eq(tables.runs.shopId, user.shopId))).limit(1)
  if (!run) throw notFound('run')
  const body = await readValid(event, SignoffVerifySchema)
  if (body.runId !== id) throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'runId: does not match the run in the address.', data: { issues: [{ path: 'runId', message: 'Does not match the run in the address.' }] } })
  // The signer, an active trainer or owner of this shop
  const [signer] = await useDB().select().from(tables.users)
    .where(and(eq(tables.users.id, body.signerId), eq(tables.users.shopId, user.shopId), eq(tables.users.active, true))).limit(1)
  if (!signer || !['owner', 'trainer'].includes(signer.role)) {
    throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'signerId: only an active trainer or owner can sign.', data: { issues: [{ path: 'signerId', message: 'Only an active trainer or owner can sign.' }] } })
  }
  // A PIN is short, so its tries count against the signer's account like sign-in failures do
  // (sign-in-throttle.ts); asking for a PIN the signer has not set is no guess and is not counted.
  const noPin = body.pin !== undefined && !signer.pinHash
  const attempt = noPin ? undefined : await beginSignInAttempt(event, signer.email, `PIN or password tries for ${signer.name}`)
  const ok = !noPin && (body.pin !== undefined
    ? await verifyPassword(signer.pinHash!, body.pin)
    : await verifyPassword(signer.passwordHash, body.password!))
  if (!ok) {
    await attempt?.failed()
    const field = body.pin !== undefined ? 'pin' : 'password'
    const message = body.pin !== undefined && !signer.pinHash ? `${signer.name} has no PIN; use the password instead.` : `That ${field === 'pin' ? 'PIN' : 'password'} is not ${signer.name}'s.`
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message, data: { issues: [{ path: field, message }] } })
  }
  await attempt?.succeeded()
  return { signerId: signer.id, signerName: signer.name, signerRole: signer.role as 'owner' | 'trainer', proof: signoffProof(signer.id, id) }
})
