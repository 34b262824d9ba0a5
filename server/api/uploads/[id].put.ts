import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import { z } from 'zod'

const ParamsSchema = z.object({ id: z.uuid() })
const QuerySchema = z.object({
  runId: z.uuid({ error: 'runId must be the id of a run in your shop.' }),
})

const stored = (row: { id: string, contentType: string, bytes: number }) => ({ id: row.id, contentType: row.contentType, bytes: row.bytes })

// One photo of a run, sent as raw bytes. The id is made on the tablet when the photo is taken,
// so a retried upload after a dropped connection stores nothing twice.
export default defineEventHandler(async (event) => {
  const { id } = paramsValid(event, ParamsSchema)
  const user = await requireShopUser(event)
  const { runId } = queryValid(event, QuerySchema)
  const db = useDB()
  // The run, only in this shop
  await findShopRun(user, runId)
  refusePathNames(event)

  const body = await readRawBody(event, false)
  if (!body?.length) {
    throw invalidInput('', 'The photo is empty: send the image bytes as the request body.')
  }
  if (body.length > MAX_PHOTO_BYTES) {
    throw createError({ statusCode: 413, statusMessage: 'Payload too large', message: `A photo may be at most ${MAX_PHOTO_BYTES / 1024 / 1024} MB; this one is ${(body.length / 1024 / 1024).toFixed(1)} MB.` })
  }
  const contentType = sniffPhotoType(body)
  if (!contentType) {
    const claimed = getRequestHeader(event, 'content-type')
    throw createError({
      statusCode: 415,
      statusMessage: 'Unsupported media type',
      message: `A photo must be a JPEG, PNG or WebP image; these bytes are none of them${claimed ? ` (whatever the ${claimed} label says)` : ''}.`,
    })
  }
  const sha256 = createHash('sha256').update(body).digest('hex')

  // The upload with this id in any shop: ids are unique across shops
  const [existing] = await db.select().from(tables.uploads).where(eq(tables.uploads.id, id)).limit(1)
  if (existing) return sameUpload(existing, user.shopId, sha256)

  const storageKey = photoKey(user.shopId, id, contentType)
  await usePhotoStorage().put(storageKey, body, contentType)
  try {
    // The new upload's row
    await db.insert(tables.uploads).values({ id, shopId: user.shopId, runId, uploadedBy: user.id, contentType, bytes: body.length, storageKey, sha256 })
  }
  catch (error: any) {
    // Two copies of the same retry raced; the first one's row stands.
    const duplicate = error?.code === 'ER_DUP_ENTRY' || error?.cause?.code === 'ER_DUP_ENTRY'
    if (!duplicate) throw error
    const [row] = await db.select().from(tables.uploads).where(eq(tables.uploads.id, id)).limit(1)
    if (!row) throw error
    return sameUpload(row, user.shopId, sha256)
  }
  setResponseStatus(event, 201)
  return { id, contentType, bytes: body.length }
})

function sameUpload(row: { id: string, shopId: number, contentType: string, bytes: number, sha256: string }, shopId: number, sha256: string) {
  // Another shop's id is not revealed to exist.
  if (row.shopId !== shopId) throw notFound('upload')
  if (row.sha256 !== sha256) {
    throw conflict('This upload id already holds a different photo; take the photo again to give it a new id.')
  }
  return stored(row)
}

/**
 * The server names every photo itself and never uses a client's file name. A name that tries to
 * reach another folder is still refused aloud, so a wrong client is noticed rather than ignored.
 */
function refusePathNames(event: H3Event) {
  const names: { path: string, value: string }[] = []
  // RFC 6266 Content-Disposition: filename="…" or filename*=UTF-8''… (percent-encoded)
  const disposition = getRequestHeader(event, 'content-disposition') ?? ''
  for (const match of disposition.matchAll(/filename(\*?)\s*=\s*(?:"([^"]*)"|([^;]*))/gi)) {
    let value = (match[2] ?? match[3] ?? '').trim()
    if (match[1]) {
      value = value.replace(/^[\w-]*'[^']*'/, '')
      try { value = decodeURIComponent(value) }
      catch {}
    }
    names.push({ path: 'content-disposition', value })
  }
  const plain = getRequestHeader(event, 'x-file-name')
  if (plain !== undefined) names.push({ path: 'x-file-name', value: plain })
  const issues = names
    .filter(n => /[/\\\0]/.test(n.value) || n.value === '.' || n.value === '..')
    .map(n => ({ path: n.path, message: `The file name ${JSON.stringify(n.value)} has folder parts; a photo name may not contain / or \\ (the server names every photo itself).` }))
  if (issues.length) {
    throw invalidIssues(issues)
  }
}
