import { z } from 'zod'

const ParamsSchema = z.object({ id: z.uuid() })

// A stored photo's bytes, for the Run screen and the run record. Its id never changes what it
// holds, so browsers and the service worker may keep it for good.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  // The upload, only in this shop
  const [row] = await useDB().select({ contentType: tables.uploads.contentType, storageKey: tables.uploads.storageKey })
    .from(tables.uploads).where(and(eq(tables.uploads.id, id), eq(tables.uploads.shopId, user.shopId))).limit(1)
  if (!row) throw notFound('photo')
  // Streamed from disk or S3, never held whole in memory.
  const photo = await usePhotoStorage().open(row.storageKey)
  if (!photo) throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'The photo is on record but its file is missing from storage.' })
  setResponseHeaders(event, {
    'content-type': row.contentType,
    'content-length': photo.bytes,
    'cache-control': 'private, max-age=31536000, immutable',
    'x-content-type-options': 'nosniff',
  })
  // A tablet that goes away mid-download must not hold the store's connection open.
  event.node.res.once('close', () => photo.body.destroy())
  return sendStream(event, photo.body)
})
