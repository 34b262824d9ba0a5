// Readiness probe for the start and test scripts and a load balancer: the server answers, the
// database too, and at least one shop exists. 200 means ready; before the first shop exists it
// answers 503, as readiness probes do. Open without sign-in, so it says only yes or no, never
// how many shops.
export default defineEventHandler(async (event) => {
  // Any one shop
  const [row] = await useDB().select({ id: tables.shops.id }).from(tables.shops).limit(1)
  if (!row) setResponseStatus(event, 503, 'Not ready')
  return { ok: true, ready: !!row }
})
