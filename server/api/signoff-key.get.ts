// The public key tablets seal sign-offs to (shared/runs/signoff-seal.ts). The tablet keeps a
// copy so a trainer can sign offline; the private key never leaves the server.
export default defineEventHandler(async (event) => {
  await requireShopUser(event)
  const { publicKey } = await useSignoffKeys()
  return publicKey
})
