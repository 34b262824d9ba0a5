import { z } from 'zod'
import { newNonce, SEAL_CHECK_WINDOW_MS, sealClaim } from '#shared/runs/signoff-seal'
import { SignoffCheckSchema } from '#shared/schemas/sync'
import { isLeadRole } from '#shared/types/roles'

const ParamsSchema = z.object({ id: z.uuid() })

// The online answer to a sealed sign-off on a trainee's tablet: is the sealed PIN or password
// the signer's? It consumes nothing; the sign-off event carries the same seal through the queue
// and the sync merge checks it again, binding and one-time nonce included. Offline, the tablet
// skips this and the sign-off waits as "awaiting check". A page served over plain http has no
// WebCrypto to seal with: it sends the claim itself and gets back the seal the server made.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  // The run, only in this shop
  await findShopRun(user, id)
  const body = await readValid(event, SignoffCheckSchema)
  const seal = body.seal ?? await sealClaim((await useSignoffKeys()).publicKey, { ...body.claim!, runId: id, nonce: newNonce() })
  const opened = await openSignoffSeal(seal)
  if (!opened.ok) throw invalidInput('seal', opened.reason)
  const claim = opened.claim
  if (claim.runId !== id) throw invalidInput('seal', 'The signature was given for another run.')
  if (Math.abs(Date.now() - Date.parse(claim.time)) > SEAL_CHECK_WINDOW_MS) throw invalidInput('seal', 'The signature expired or the tablet\'s clock is wrong; sign again.')
  // The signer, an active trainer or owner of this shop
  const [signer] = await useDB().select().from(tables.users)
    .where(and(eq(tables.users.id, claim.signerId), eq(tables.users.shopId, user.shopId), eq(tables.users.active, true))).limit(1)
  if (!signer || !isLeadRole(signer.role)) throw invalidInput('signerId', 'Only an active trainer or owner can sign.')
  // Was this nonce used by a stored sign-off already?
  const [used] = await useDB().select({ nonce: tables.signoffNonces.nonce }).from(tables.signoffNonces).where(eq(tables.signoffNonces.nonce, claim.nonce)).limit(1)
  if (used) throw invalidInput('seal', 'This signature was already used once; sign again.')
  const secret = await checkSignerSecret(signer, claim, clientAddress(event))
  if (!secret.ok) {
    if (secret.lockedMs) throw signoffLocked(event, secret.lockedMs, signer.name)
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: secret.reason, data: { issues: [{ path: secret.field, message: secret.reason }] } })
  }
  return { signerId: signer.id, signerName: signer.name, signerRole: signer.role as 'owner' | 'trainer', ...(body.claim ? { seal } : {}) }
})
