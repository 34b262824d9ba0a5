import { createHmac, timingSafeEqual } from 'node:crypto'

// A sign-off is given on the trainee's tablet: the trainer proves who they are once (PIN or
// password, checked online) and gets a proof bound to the signer and the run. The event that
// carries it may then wait in the offline queue; the merge checks the proof, so a trainee
// cannot make up a trainer's sign-off.
function key() {
  const secret = useRuntimeConfig().session?.password
  if (!secret) throw new Error('NUXT_SESSION_PASSWORD is not set')
  return `jogwise-signoff:${secret}`
}

export function signoffProof(signerId: number, runId: string) {
  return createHmac('sha256', key()).update(`${signerId}:${runId}`).digest('base64url')
}

export function checkSignoffProof(signerId: number, runId: string, proof: unknown) {
  if (typeof proof !== 'string' || proof.length > 100) return false
  const expected = Buffer.from(signoffProof(signerId, runId))
  const given = Buffer.from(proof)
  return given.length === expected.length && timingSafeEqual(given, expected)
}
