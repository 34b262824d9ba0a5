// Readiness probe for the start and test scripts: the server answers, the database too, and at
// least one shop exists. Open without sign-in, so it says only yes or no, never how many shops.
export default defineEventHandler(async () => {
  // Any one shop
  const [row] = await useDB().select({ id: tables.shops.id }).from(tables.shops).limit(1)
  return { ok: true, ready: !!row }
})
