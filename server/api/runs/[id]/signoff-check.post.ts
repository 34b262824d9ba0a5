import { z } from 'zod'
import { newNonce, SEAL_CHECK_WINDOW_MS, sealClaim } from '#shared/runs/signoff-seal'
import { SignoffCheckSchema } from '#shared/schemas/sync'

const ParamsSchema = z.object({ id: z.uuid() })

const invalid = (path: string, message: string) =>
  createError({ statusCode: 400, statusMessage: 'Invalid input', message: `${path}: ${message}`, data: { issues: [{ path, message }] } })

// The online answer to a sealed sign-off on a trainee's tablet: is the sealed PIN or password
// the signer's? It consumes nothing; the sign-off event carries the same seal through the queue
// and the sync merge checks it again, binding and one-time nonce included. Offline, the tablet
// skips this and the sign-off waits as "awaiting check". A page served over plain http has no
// WebCrypto to seal with: it sends the claim itself and gets back the seal the server made.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  // The run, only in this shop
  const [run] = await useDB().select({ id: tables.runs.id }).from(tables.runs).where(and(eq(tables.runs.id, id), eq(tables.runs.shopId, user.shopId))).limit(1)
  if (!run) throw notFound('run')
  const body = await readValid(event, SignoffCheckSchema)
  const seal = body.seal ?? await sealClaim((await useSignoffKeys()).publicKey, { ...body.claim!, runId: id, nonce: newNonce() })
  const opened = await openSignoffSeal(seal)
  if (!opened.ok) throw invalid('seal', opened.reason)
  const claim = opened.claim
  if (claim.runId !== id) throw invalid('seal', 'The signature was given for another run.')
  if (Math.abs(Date.now() - Date.parse(claim.time)) > SEAL_CHECK_WINDOW_MS) throw invalid('seal', 'The signature expired or the tablet\'s clock is wrong; sign again.')
  // The signer, an active trainer or owner of this shop
  const [signer] = await useDB().select().from(tables.users)
    .where(and(eq(tables.users.id, claim.signerId), eq(tables.users.shopId, user.shopId), eq(tables.users.active, true))).limit(1)
  if (!signer || !['owner', 'trainer'].includes(signer.role)) throw invalid('signerId', 'Only an active trainer or owner can sign.')
  // Was this nonce used by a stored sign-off already?
  const [used] = await useDB().select({ nonce: tables.signoffNonces.nonce }).from(tables.signoffNonces).where(eq(tables.signoffNonces.nonce, claim.nonce)).limit(1)
  if (used) throw invalid('seal', 'This signature was already used once; sign again.')
  const secret = await checkSignerSecret(signer, claim, clientAddress(event))
  if (!secret.ok) {
    if (secret.lockedMs) throw signoffLocked(event, secret.lockedMs, signer.name)
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: secret.reason, data: { issues: [{ path: secret.field, message: secret.reason }] } })
  }
  return { signerId: signer.id, signerName: signer.name, signerRole: signer.role as 'owner' | 'trainer', ...(body.claim ? { seal } : {}) }
})
