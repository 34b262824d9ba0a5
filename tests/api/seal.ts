import { newNonce, sealClaim, type SealClaim, type SealKey } from '../../shared/runs/signoff-seal'
import { call } from './client'

// Seals a sign-off as the tablet does (shared/runs/signoff-seal.ts, Node's WebCrypto here),
// to the key the server hands out at GET /api/signoff-key.
let key: SealKey | undefined
export async function serverKey(cookie: string): Promise<SealKey> {
  if (key) return key
  const res = await call('GET', '/api/signoff-key', { cookie })
  if (res.status !== 200) throw new Error(res.text)
  return (key = res.body as SealKey)
}

export async function seal(cookie: string, claim: Omit<SealClaim, 'nonce'> & { nonce?: string }) {
  return sealClaim(await serverKey(cookie), { nonce: newNonce(), ...claim } as SealClaim)
}
