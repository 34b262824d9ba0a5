// Owner: queue today's digest for this shop now instead of waiting for the digest hour. Once
// per owner and day, like the scheduled one.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const result = await enqueueShopDigest(owner.shopId)
  return { ...result, message: result.queued ? 'Today\'s digest is on its way.' : 'Today\'s digest was already queued.' }
})
