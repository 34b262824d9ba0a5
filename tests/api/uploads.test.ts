import { createHash, randomUUID } from 'node:crypto'
import { inflateSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { v7 as uuidv7 } from 'uuid'
import { makeJpeg, makePng, pngChunks, WEBP_1PX } from '../support/images'
import { as, BASE_URL, call, db, otherShop } from './client'

// Photo evidence through PUT/GET /api/uploads/[id] against the built server and real MariaDB:
// only JPEG, PNG or WebP by their own first bytes, at most 10 MB, ids made by the tablet so a
// retry stores nothing twice, and another shop's photo is never found.

const PROCEDURE = {
  title: 'Upload check procedure',
  summary: 'One photo step, used by the upload checks.',
  category: 'daily',
  steps: [
    { key: 'pic', kind: 'photo', title: 'Photograph the bed', body: 'Take one photo of the clear bed.', subject: 'The whole bed from above.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The bed was clear.' },
  ],
}

async function put(id: string, runId: string, bytes: Buffer | string, opts: { cookie?: string, contentType?: string, headers?: Record<string, string> } = {}) {
  const res = await fetch(`${BASE_URL}/api/uploads/${id}?runId=${runId}`, {
    method: 'PUT',
    headers: { 'content-type': opts.contentType ?? 'application/octet-stream', 'accept': 'application/json', 'cookie': opts.cookie ?? await as('operator'), ...opts.headers },
    body: typeof bytes === 'string' ? bytes : new Uint8Array(bytes),
  })
  const text = await res.text()
  let body: any
  try { body = JSON.parse(text) }
  catch { body = undefined }
  return { status: res.status, body, text }
}

async function rows(id: string) {
  const [found] = await db().query<any[]>('select * from uploads where id = ?', [id])
  return found
}

let runId: string
let other: Awaited<ReturnType<typeof otherShop>>
beforeAll(async () => {
  const owner = await as('owner')
  const made = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: PROCEDURE } })
  if (made.status !== 201) throw new Error(made.text)
  const machineId = (await call('GET', '/api/machines', { cookie: owner })).body[0].id
  const me = (await call('GET', '/api/me', { cookie: await as('operator') })).body.user
  runId = uuidv7()
  const started = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'upload-check', events: [{
    id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: me.id, deviceId: 'upload-check',
    procedureVersionId: made.body.versionId, machineId, mode: 'guided',
  }] } })
  if (started.body.accepted?.length !== 1) throw new Error(started.text)
  other = await otherShop()
})
afterAll(async () => { await db().end() })

describe('PUT and GET /api/uploads/[id]', () => {
  it('stores a real PNG and gives back the very same bytes', async () => {
    const png = makePng(40, 30)
    const chunks = pngChunks(png)
    expect(chunks.map(c => c.type)).toEqual(['IHDR', 'IDAT', 'IEND'])
    expect(chunks.every(c => c.crcOk)).toBe(true)
    expect(inflateSync(chunks[1]!.data).length).toBe(30 * (1 + 40 * 3))

    const id = randomUUID()
    // The claimed type and a file name with path parts are ignored: the bytes decide.
    const res = await put(id, runId, png, { contentType: 'application/octet-stream' })
    expect(res.status, res.text).toBe(201)
    expect(res.body).toEqual({ id, contentType: 'image/png', bytes: png.length })

    const back = await fetch(`${BASE_URL}/api/uploads/${id}`, { headers: { cookie: await as('trainee') } })
    expect(back.status).toBe(200)
    expect(back.headers.get('content-type')).toBe('image/png')
    expect(back.headers.get('cache-control')).toBe('private, max-age=31536000, immutable')
    expect(Buffer.from(await back.arrayBuffer()).equals(png)).toBe(true)

    const row = await rows(id)
    expect(row).toHaveLength(1)
    expect(row[0].sha256).toBe(createHash('sha256').update(png).digest('hex'))
    expect(row[0].bytes).toBe(png.length)
    expect(row[0].run_id).toBe(runId)
    expect(row[0].storage_key).toBe(`${row[0].shop_id}/${id}.png`)
  })

  it('stores a WebP by its RIFF/WEBP header', async () => {
    const id = randomUUID()
    const res = await put(id, runId, WEBP_1PX, { contentType: 'image/webp' })
    expect(res.status, res.text).toBe(201)
    expect(res.body.contentType).toBe('image/webp')
  })

  it('refuses text dressed up as a JPEG with 415', async () => {
    const id = randomUUID()
    const res = await put(id, runId, 'Not a picture at all, only words.\n', { contentType: 'image/jpeg' })
    expect(res.status).toBe(415)
    expect(res.body.message).toMatch(/JPEG, PNG or WebP/)
    expect(await rows(id)).toHaveLength(0)
  })

  it('refuses text under a photo\'s name and label, and files JPEG bytes labelled PNG as JPEG', async () => {
    // The name says .png and the label image/png, but the bytes are words (no PNG signature).
    const id = randomUUID()
    const res = await put(id, runId, 'PNG is what the name says; these are words.\n', { contentType: 'image/png', headers: { 'content-disposition': 'inline; filename="bed.png"' } })
    expect(res.status).toBe(415)
    expect(res.body.message).toMatch(/JPEG, PNG or WebP/)
    expect(await rows(id)).toHaveLength(0)

    // The first bytes decide (ITU-T T.81 SOI marker), not the label.
    const jpeg = makeJpeg(16, 16)
    const jpegId = randomUUID()
    const stored = await put(jpegId, runId, jpeg, { contentType: 'image/png', headers: { 'content-disposition': 'inline; filename="bed.png"' } })
    expect(stored.status, stored.text).toBe(201)
    expect(stored.body.contentType).toBe('image/jpeg')
    const row = await rows(jpegId)
    expect(row[0].storage_key).toBe(`${row[0].shop_id}/${jpegId}.jpg`)
    const back = await fetch(`${BASE_URL}/api/uploads/${jpegId}`, { headers: { cookie: await as('operator') } })
    expect(back.headers.get('content-type')).toBe('image/jpeg')
    expect(Buffer.from(await back.arrayBuffer()).equals(jpeg)).toBe(true)
  })

  it('refuses a file name with folder parts with 400 and stores nothing', async () => {
    const png = makePng(4, 4, 1)
    const cases: [Record<string, string>, string][] = [
      [{ 'content-disposition': 'attachment; filename="../../etc/passwd.png"' }, 'content-disposition'],
      // RFC 6266 / RFC 8187 extended form, percent-encoded: ../x.png
      [{ 'content-disposition': 'attachment; filename*=UTF-8\'\'..%2Fx.png' }, 'content-disposition'],
      [{ 'x-file-name': 'photos\\..\\x.png' }, 'x-file-name'],
      [{ 'x-file-name': '..' }, 'x-file-name'],
    ]
    for (const [headers, path] of cases) {
      const id = randomUUID()
      const res = await put(id, runId, png, { contentType: 'image/png', headers })
      expect(res.status, JSON.stringify(headers)).toBe(400)
      expect(res.body.data.issues[0].path).toBe(path)
      expect(res.body.message).toMatch(/folder parts/)
      expect(await rows(id)).toHaveLength(0)
    }
    // An id with path parts never reaches storage: anything but a UUID is no such upload.
    for (const bad of ['..%2Fx', '..%5Cx', '..x', `${randomUUID()}%2F..`]) {
      const res = await fetch(`${BASE_URL}/api/uploads/${bad}?runId=${runId}`, { method: 'PUT', headers: { cookie: await as('operator'), accept: 'application/json' }, body: png })
      expect(res.status, bad).toBe(404)
    }
    const [[count]] = await db().query<any[]>('select count(*) as n from uploads where storage_key not regexp ?', ['^[0-9]+/[0-9a-f-]{36}[.](jpg|png|webp)$'])
    expect(Number(count.n)).toBe(0)
    // A plain name is ignored: the server makes the key from shop and upload id.
    const id = randomUUID()
    const plain = await put(id, runId, png, { contentType: 'image/png', headers: { 'content-disposition': 'attachment; filename="my bed.png"' } })
    expect(plain.status, plain.text).toBe(201)
    const row = await rows(id)
    expect(row[0].storage_key).toBe(`${row[0].shop_id}/${id}.png`)
  })

  it('refuses a photo over 10 MB with 413, at the route and at the /api body limit', async () => {
    // Just over 10 MB passes the 11 MB body limit, so the route itself measures it.
    const justOver = Buffer.alloc(10 * 1024 * 1024 + 1)
    makePng(2, 2).copy(justOver)
    const a = await put(randomUUID(), runId, justOver, { contentType: 'image/png' })
    expect(a.status).toBe(413)
    expect(a.body.message).toMatch(/at most 10 MB/)

    const eleven = Buffer.alloc(11 * 1024 * 1024 + 1)
    makePng(2, 2).copy(eleven)
    const id = randomUUID()
    const b = await put(id, runId, eleven, { contentType: 'image/png' })
    expect(b.status).toBe(413)
    expect(await rows(id)).toHaveLength(0)
  })

  it('refuses an empty body with 400 and a missing run id with 400', async () => {
    const empty = await put(randomUUID(), runId, Buffer.alloc(0), { contentType: 'image/png' })
    expect(empty.status).toBe(400)
    expect(empty.body.message).toMatch(/empty/)
    const noRun = await fetch(`${BASE_URL}/api/uploads/${randomUUID()}`, { method: 'PUT', headers: { cookie: await as('operator'), accept: 'application/json' }, body: makePng(2, 2) })
    expect(noRun.status).toBe(400)
    expect((await noRun.json()).data.issues[0].path).toBe('runId')
  })

  it('stores the same id only once however often it is sent, and refuses other bytes under it', async () => {
    const id = randomUUID()
    const png = makePng(8, 8, 3)
    const first = await put(id, runId, png)
    const second = await put(id, runId, png)
    expect([first.status, second.status]).toEqual([201, 200])
    expect(second.body).toEqual(first.body)
    expect(await rows(id)).toHaveLength(1)
    const changed = await put(id, runId, makePng(8, 8, 4))
    expect(changed.status).toBe(409)
  })

  it('answers 404 for an unknown run, a run of another shop, and an id that is not a UUID', async () => {
    expect((await put(randomUUID(), randomUUID(), makePng(2, 2))).status).toBe(404)
    expect((await put(randomUUID(), other.runId, makePng(2, 2))).status).toBe(404)
    const res = await fetch(`${BASE_URL}/api/uploads/..%2F..%2Fpasswd?runId=${runId}`, { method: 'PUT', headers: { cookie: await as('operator'), accept: 'application/json' }, body: makePng(2, 2) })
    expect(res.status).toBe(404)
  })

  it('never shows or reuses another shop\'s photo', async () => {
    const id = randomUUID()
    const theirs = makePng(6, 6, 9)
    const stored = await put(id, other.runId, theirs, { cookie: other.cookie })
    expect(stored.status, stored.text).toBe(201)
    const seen = await call('GET', `/api/uploads/${id}`, { cookie: await as('owner') })
    expect(seen.status).toBe(404)
    // The same id sent from this shop is refused without saying it exists.
    const reuse = await put(id, runId, theirs, { cookie: await as('owner') })
    expect(reuse.status).toBe(404)
    expect(reuse.text).not.toContain('Second Test Shop')
    const row = await rows(id)
    expect(row).toHaveLength(1)
    expect(row[0].shop_id).toBe(other.shopId)
    // The other shop still reads its own photo.
    const own = await fetch(`${BASE_URL}/api/uploads/${id}`, { headers: { cookie: other.cookie } })
    expect(Buffer.from(await own.arrayBuffer()).equals(theirs)).toBe(true)
  })
})
