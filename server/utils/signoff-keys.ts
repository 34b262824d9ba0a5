import { randomBytes } from 'node:crypto'
import { fromBase64url, toBase64url, type SealKey } from '#shared/runs/signoff-seal'

// The key pair tablets seal sign-offs to. It lives in the database (one row, id 1) so every app
// server of a cluster opens the same seals; the first server to need it makes it, and a server
// that loses that race reads the winner's row. The private key never leaves the server.
// RSA 3072 bits: NIST SP 800-57 Part 1 gives it 128-bit strength, good past 2030.
const RSA = { name: 'RSA-OAEP', hash: 'SHA-256' } as const
let cached: Promise<{ publicKey: SealKey, privateKey: CryptoKey }> | undefined

async function load() {
  const db = useDB()
  let [row] = await db.select().from(tables.signoffKeys).where(eq(tables.signoffKeys.id, 1)).limit(1)
  if (!row) {
    const pair = await crypto.subtle.generateKey({ ...RSA, modulusLength: 3072, publicExponent: new Uint8Array([1, 0, 1]) }, true, ['wrapKey', 'unwrapKey'])
    const spki = toBase64url(new Uint8Array(await crypto.subtle.exportKey('spki', pair.publicKey)))
    const pkcs8 = toBase64url(new Uint8Array(await crypto.subtle.exportKey('pkcs8', pair.privateKey)))
    // Only one row may ever be the key: a second server's insert is ignored
    await db.insert(tables.signoffKeys).ignore().values({ id: 1, keyId: randomBytes(9).toString('base64url'), publicSpki: spki, privatePkcs8: pkcs8 })
    ;[row] = await db.select().from(tables.signoffKeys).where(eq(tables.signoffKeys.id, 1)).limit(1)
  }
  if (!row) throw new Error('The sign-off key could not be stored.')
  const privateKey = await crypto.subtle.importKey('pkcs8', fromBase64url(row.privatePkcs8), RSA, false, ['unwrapKey'])
  return { publicKey: { keyId: row.keyId, spki: row.publicSpki }, privateKey }
}

/** The sign-off key pair, read (or made) once per process. */
export function useSignoffKeys() {
  cached ??= load().catch((error) => {
    cached = undefined
    throw error
  })
  return cached
}
