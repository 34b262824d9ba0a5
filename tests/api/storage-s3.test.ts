import { createHash, randomUUID } from 'node:crypto'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
import { imageMeta } from 'image-meta'
import S3rver from 's3rver'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { photoKey, photoStorageFrom, checkPhotoKey } from '../../server/utils/storage'
import { s3OptionsFrom, s3Storage } from '../../server/utils/storage-s3'
import { freePort, SERVER_ENTRY, startApp, type AppServer } from '../support/app-server'
import { makeJpeg, makePng, WEBP_1PX } from '../support/images'
import { db, DEMO, DEMO_PASSWORD, otherShop } from './client'

// The S3-compatible photo driver against s3rver, a fake S3 server from npm, on a free loopback
// port with its own folder: first the driver itself, then the app started a second time from
// the suite's build with NUXT_STORAGE_DRIVER=s3, and twice more with broken S3 settings.

const BUCKET = 'jogwise-photos'
// s3rver's documented key pair for signed requests (s3rver README, "Supported clients").
const KEYS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }
const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')

const servers: AppServer[] = []

/** The built app once more, on its own port, with the given storage settings. */
async function startS3App(env: Record<string, string>): Promise<AppServer> {
  const server = await startApp({ NUXT_UPLOADS_DIR: join(folder, 'must-stay-empty'), ...env })
  servers.push(server)
  return server
}

async function signIn(url: string, email: string, password = DEMO_PASSWORD) {
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) })
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}: ${await res.text()}`)
  return res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

const putPhoto = (url: string, id: string, runId: string, bytes: Buffer, cookie: string) =>
  fetch(`${url}/api/uploads/${id}?runId=${runId}`, { method: 'PUT', headers: { 'content-type': 'application/octet-stream', 'accept': 'application/json', cookie }, body: new Uint8Array(bytes) })

let folder: string
let fake: S3rver
let endpoint: string
let raw: S3Client

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'jogwise-s3-'))
  const port = await freePort()
  fake = new S3rver({ port, address: '127.0.0.1', directory: join(folder, 's3'), silent: true, configureBuckets: [{ name: BUCKET }] })
  await fake.run()
  endpoint = `http://127.0.0.1:${port}`
  // A plain SDK client of its own, to look at what really landed in the bucket.
  raw = new S3Client({ endpoint, region: 'us-east-1', forcePathStyle: true, credentials: KEYS })
})
afterAll(async () => {
  await Promise.all(servers.map(s => s.stop()))
  raw?.destroy()
  await fake?.close()
  if (folder) rmSync(folder, { recursive: true, force: true })
  await db().end()
})

describe('the S3 driver against s3rver', () => {
  const driver = () => s3Storage({ endpoint, region: 'us-east-1', bucket: BUCKET, forcePathStyle: true, ...KEYS }, checkPhotoKey)

  it.each([
    ['image/jpeg', 'jpg', makeJpeg(40, 24)],
    ['image/png', 'png', makePng(30, 20, 5)],
    ['image/webp', 'webp', WEBP_1PX],
  ] as const)('stores %s and gives back the same bytes, type and checksums', async (type, ext, bytes) => {
    // The sample really is that format by an independent reader (image-meta).
    expect(imageMeta(bytes).type).toBe(ext)
    const key = photoKey(7, randomUUID(), type)
    const storage = driver()
    expect(storage.driver).toBe('s3')
    await storage.put(key, bytes, type)

    const back = await storage.get(key)
    expect(back && sha256(back)).toBe(sha256(bytes))
    const opened = await storage.open(key)
    expect(opened).not.toBeNull()
    expect(opened!.bytes).toBe(bytes.length)
    expect(opened!.contentType).toBe(type)
    const chunks: Buffer[] = []
    for await (const chunk of opened!.body) chunks.push(Buffer.from(chunk))
    expect(sha256(Buffer.concat(chunks))).toBe(sha256(bytes))

    // What S3 itself holds: the content type, our sha256, and an ETag that is the MD5 of a
    // single-part upload (Amazon S3 API reference, "Common Response Headers": ETag).
    const head = await raw.send(new HeadObjectCommand({ Bucket: BUCKET, Key: key }))
    expect(head.ContentType).toBe(type)
    expect(head.ContentLength).toBe(bytes.length)
    expect(head.Metadata?.sha256).toBe(sha256(bytes))
    expect(head.ETag).toBe(`"${createHash('md5').update(bytes).digest('hex')}"`)
  })

  it('answers null for a missing key and refuses keys it did not make', async () => {
    const storage = driver()
    expect(await storage.get(photoKey(7, randomUUID(), 'image/png'))).toBeNull()
    expect(await storage.open(photoKey(7, randomUUID(), 'image/png'))).toBeNull()
    for (const key of ['../7/x.png', '7/../../x.png', '7/photo.png', `7/${randomUUID()}.svg`]) {
      await expect(storage.put(key, makePng(2, 2), 'image/png')).rejects.toThrow(/refused storage key/)
      await expect(storage.get(key)).rejects.toThrow(/refused storage key/)
    }
    const listed = await raw.send(new ListObjectsV2Command({ Bucket: BUCKET }))
    expect((listed.Contents ?? []).every(o => /^\d+\/[0-9a-f-]{36}\.(jpg|png|webp)$/.test(o.Key!))).toBe(true)
  })

  it('fails loudly, not as "missing", when the bucket does not exist', async () => {
    const storage = s3Storage({ endpoint, region: 'us-east-1', bucket: 'no-such-bucket', forcePathStyle: true, ...KEYS }, checkPhotoKey)
    await expect(storage.get(photoKey(7, randomUUID(), 'image/png'))).rejects.toThrow(/bucket/i)
  })

  it('names every setting that is missing or wrong', () => {
    expect(s3OptionsFrom({ region: 'us-east-1', bucket: BUCKET, forcePathStyle: true })).toEqual({
      options: { endpoint: undefined, region: 'us-east-1', bucket: BUCKET, accessKeyId: undefined, secretAccessKey: undefined, forcePathStyle: true },
      problems: [],
    })
    const bad = s3OptionsFrom({ endpoint: 'ftp://files', accessKeyId: 'only-half', forcePathStyle: 'maybe' })
    expect(bad.options).toBeNull()
    expect(bad.problems.join('\n')).toMatch(/NUXT_S3_BUCKET is empty/)
    expect(bad.problems.join('\n')).toMatch(/NUXT_S3_REGION is empty/)
    expect(bad.problems.join('\n')).toMatch(/NUXT_S3_ENDPOINT "ftp:\/\/files"/)
    expect(bad.problems.join('\n')).toMatch(/NUXT_S3_SECRET_ACCESS_KEY/)
    expect(bad.problems.join('\n')).toMatch(/NUXT_S3_FORCE_PATH_STYLE/)
    expect(s3OptionsFrom({ region: 'us-east-1', bucket: 'Photos_Here' }).problems[0]).toMatch(/not a valid bucket name/)
    expect(photoStorageFrom({ storageDriver: 'ftp' }).problems[0]).toMatch(/NUXT_STORAGE_DRIVER "ftp" is unknown/)
    expect(photoStorageFrom({ storageDriver: '', uploadsDir: folder }).storage?.driver).toBe('local')
    expect(photoStorageFrom({ storageDriver: 'S3', s3: { region: 'us-east-1', bucket: BUCKET } }).storage?.driver).toBe('s3')
  })
})

describe('the app with NUXT_STORAGE_DRIVER=s3', () => {
  let app: AppServer
  let cookie: string
  let runId: string

  beforeAll(async () => {
    if (!existsSync(SERVER_ENTRY)) throw new Error(`no build at ${SERVER_ENTRY}; run npm test`)
    app = await startS3App({
      NUXT_STORAGE_DRIVER: 's3',
      NUXT_S3_ENDPOINT: endpoint,
      NUXT_S3_REGION: 'us-east-1',
      NUXT_S3_BUCKET: BUCKET,
      NUXT_S3_ACCESS_KEY_ID: KEYS.accessKeyId,
      NUXT_S3_SECRET_ACCESS_KEY: KEYS.secretAccessKey,
      NUXT_S3_FORCE_PATH_STYLE: 'true',
    })
    cookie = await signIn(app.url, DEMO.operator)
    const get = async (path: string) => (await fetch(app.url + path, { headers: { cookie } })).json()
    const me = (await get('/api/me')).user
    const machine = (await get('/api/machines'))[0]
    const procedure = (await get('/api/procedures'))[0]
    runId = uuidv7()
    const started = await fetch(`${app.url}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body: JSON.stringify({ deviceId: 's3-check', events: [{
      id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: me.id, deviceId: 's3-check',
      procedureVersionId: procedure.current.id, machineId: machine.id, mode: 'guided',
    }] }) })
    const answer = await started.json()
    if (answer.accepted?.length !== 1) throw new Error(JSON.stringify(answer))
  })

  it('says at start-up which store it uses', () => {
    expect(app.log()).toContain(`photo storage: bucket ${BUCKET} at ${endpoint}`)
  })

  it('uploads to the bucket and downloads the very same bytes', async () => {
    for (const bytes of [makePng(64, 48, 11), makeJpeg(64, 48), WEBP_1PX]) {
      const id = randomUUID()
      const res = await putPhoto(app.url, id, runId, bytes, cookie)
      expect(res.status, await res.clone().text()).toBe(201)
      const { contentType } = await res.json()
      const back = await fetch(`${app.url}/api/uploads/${id}`, { headers: { cookie } })
      expect(back.status).toBe(200)
      expect(back.headers.get('content-type')).toBe(contentType)
      expect(back.headers.get('content-length')).toBe(String(bytes.length))
      expect(sha256(Buffer.from(await back.arrayBuffer()))).toBe(sha256(bytes))

      // It is in S3 under the server-made key, not on local disk.
      const [[row]] = await db().query<any[]>('select shop_id, storage_key, sha256 from uploads where id = ?', [id])
      expect(row.storage_key).toBe(`${row.shop_id}/${id}.${imageMeta(bytes).type}`)
      expect(row.sha256).toBe(sha256(bytes))
      const object = await raw.send(new GetObjectCommand({ Bucket: BUCKET, Key: row.storage_key }))
      expect(sha256(await object.Body!.transformToByteArray())).toBe(sha256(bytes))
    }
    expect(existsSync(join(folder, 'must-stay-empty'))).toBe(false)
  })

  it('serves a photo put through one app server from another (cluster mode: both on the same bucket)', async () => {
    const second = await startS3App({
      NUXT_STORAGE_DRIVER: 's3', NUXT_S3_ENDPOINT: endpoint, NUXT_S3_REGION: 'us-east-1', NUXT_S3_BUCKET: BUCKET,
      NUXT_S3_ACCESS_KEY_ID: KEYS.accessKeyId, NUXT_S3_SECRET_ACCESS_KEY: KEYS.secretAccessKey, NUXT_S3_FORCE_PATH_STYLE: 'true',
    })
    const bytes = makePng(40, 30, 7)
    const id = randomUUID()
    // Put through the first server; the session cookie made there works on the second too.
    expect((await putPhoto(app.url, id, runId, bytes, cookie)).status).toBe(201)
    const back = await fetch(`${second.url}/api/uploads/${id}`, { headers: { cookie } })
    expect(back.status).toBe(200)
    expect(sha256(Buffer.from(await back.arrayBuffer()))).toBe(sha256(bytes))
    // The same id sent again through the second server (a tablet's retry) stores nothing twice.
    const again = await putPhoto(second.url, id, runId, bytes, cookie)
    expect(again.status).toBeLessThan(300)
    const [[rows]] = await db().query<any[]>('select count(*) as n from uploads where id = ?', [id])
    expect(Number(rows.n)).toBe(1)
    const listed = await raw.send(new ListObjectsV2Command({ Bucket: BUCKET, Prefix: `${(await db().query<any[]>('select shop_id from uploads where id = ?', [id]))[0][0].shop_id}/${id}` }))
    expect(listed.KeyCount).toBe(1)
  })

  it('never shows another shop\'s photo', async () => {
    const other = await otherShop()
    const otherCookie = await signIn(app.url, (await db().query<any[]>('select email from users where shop_id = ? and role = ?', [other.shopId, 'owner']))[0][0].email, 'other-shop-password')
    const id = randomUUID()
    const theirs = makePng(12, 12, 42)
    expect((await putPhoto(app.url, id, other.runId, theirs, otherCookie)).status).toBe(201)
    const seen = await fetch(`${app.url}/api/uploads/${id}`, { headers: { cookie: await signIn(app.url, DEMO.owner), accept: 'application/json' } })
    expect(seen.status).toBe(404)
    const said = await seen.json()
    expect(said.message).toBe('No such photo.')
    // Neither the other shop's key nor its bucket shows through.
    expect(JSON.stringify(said)).not.toContain(`${other.shopId}/${id}`)
    expect(JSON.stringify(said)).not.toContain(BUCKET)
    const own = await fetch(`${app.url}/api/uploads/${id}`, { headers: { cookie: otherCookie } })
    expect(sha256(Buffer.from(await own.arrayBuffer()))).toBe(sha256(theirs))
  })

  it('answers 404 for a photo on record whose object is gone from the bucket', async () => {
    const id = randomUUID()
    const [[shop]] = await db().query<any[]>('select shop_id from runs where id = ?', [runId])
    await db().query('insert into uploads (id, shop_id, run_id, uploaded_by, content_type, bytes, storage_key, sha256) select ?, shop_id, id, started_by, ?, 1, ?, ? from runs where id = ?',
      [id, 'image/png', `${shop.shop_id}/${id}.png`, '0'.repeat(64), runId])
    const res = await fetch(`${app.url}/api/uploads/${id}`, { headers: { cookie, accept: 'application/json' } })
    expect(res.status).toBe(404)
    expect((await res.json()).message).toMatch(/missing from storage/)
  })
})

describe('the app with broken S3 settings', () => {
  it('logs the missing bucket at start-up and answers uploads with a plain 503', async () => {
    const app = await startS3App({ NUXT_STORAGE_DRIVER: 's3', NUXT_S3_ENDPOINT: endpoint, NUXT_S3_REGION: 'us-east-1', NUXT_S3_BUCKET: '' })
    expect(app.log()).toMatch(/photo storage is not set up[\s\S]*NUXT_S3_BUCKET is empty/)
    const cookie = await signIn(app.url, DEMO.operator)
    const res = await putPhoto(app.url, randomUUID(), uuidv7(), makePng(2, 2), cookie)
    // The run is looked up first; an unknown run is still a 404, so use a real one.
    expect(res.status).toBe(404)
    const [[run]] = await db().query<any[]>('select r.id from runs r join users u on u.shop_id = r.shop_id where u.email = ? limit 1', [DEMO.operator])
    const refused = await putPhoto(app.url, randomUUID(), run.id, makePng(2, 2), cookie)
    expect(refused.status).toBe(503)
    const body = await refused.json()
    expect(body.message).toMatch(/Photo storage is not set up on this server/)
    expect(JSON.stringify(body)).not.toMatch(/\bat .*\.(m?js|ts):\d+/)
    await app.stop()
  })

  it('logs the S3 error and answers 503 when the bucket is not there', async () => {
    const app = await startS3App({ NUXT_STORAGE_DRIVER: 's3', NUXT_S3_ENDPOINT: endpoint, NUXT_S3_REGION: 'us-east-1', NUXT_S3_BUCKET: 'no-such-bucket', NUXT_S3_ACCESS_KEY_ID: KEYS.accessKeyId, NUXT_S3_SECRET_ACCESS_KEY: KEYS.secretAccessKey, NUXT_S3_FORCE_PATH_STYLE: 'true' })
    const cookie = await signIn(app.url, DEMO.operator)
    const [[run]] = await db().query<any[]>('select r.id from runs r join users u on u.shop_id = r.shop_id where u.email = ? limit 1', [DEMO.operator])
    const id = randomUUID()
    const res = await putPhoto(app.url, id, run.id, makePng(3, 3), cookie)
    expect(res.status).toBe(503)
    const body = await res.json()
    expect(body.message).toMatch(/did not take the photo/)
    expect(JSON.stringify(body)).not.toMatch(/NoSuchBucket|stack/)
    // Nothing on record for a photo that was not stored; the tablet sends it again later.
    const [rows] = await db().query<any[]>('select id from uploads where id = ?', [id])
    expect(rows).toHaveLength(0)
    await expect.poll(() => app.log()).toMatch(/photo storage \(s3\) failed to store .*NoSuchBucket/)
    await app.stop()
  })
})
