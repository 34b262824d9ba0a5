import { createHash } from 'node:crypto'
import type { Readable } from 'node:stream'
import { GetObjectCommand, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3'
import type { PhotoStorage, StoredPhoto } from './storage'

// The S3-compatible photo driver. Plain node and the AWS SDK only (no Nitro helpers), so the
// tests can drive it directly against a local fake S3 as well as through the API.

export interface S3StorageOptions {
  /** Empty means the AWS S3 service itself; otherwise e.g. http://127.0.0.1:9000. */
  endpoint?: string
  region: string
  bucket: string
  /** Both empty: the SDK's own credential chain (instance role, profile, AWS_* variables). */
  accessKeyId?: string
  secretAccessKey?: string
  /** Bucket in the path instead of the host name; most self-hosted S3 servers need it. */
  forcePathStyle?: boolean
}

/** The raw `s3` runtime config block, as Nuxt fills it from NUXT_S3_* (values may arrive parsed). */
export interface S3Config {
  endpoint?: unknown
  region?: unknown
  bucket?: unknown
  accessKeyId?: unknown
  secretAccessKey?: unknown
  forcePathStyle?: unknown
}

const text = (value: unknown) => (value === undefined || value === null ? '' : String(value).trim())

/**
 * Checks the S3 settings once, at start-up. Answers the driver options, or every problem in
 * words an operator can act on (the variable to set), never a half-working client.
 */
export function s3OptionsFrom(config: S3Config): { options: S3StorageOptions, problems: [] } | { options: null, problems: string[] } {
  const endpoint = text(config.endpoint)
  const region = text(config.region)
  const bucket = text(config.bucket)
  const accessKeyId = text(config.accessKeyId)
  const secretAccessKey = text(config.secretAccessKey)
  const problems: string[] = []
  if (!bucket) problems.push('NUXT_S3_BUCKET is empty: name the bucket that holds the photos.')
  // Bucket naming rules of S3 (lower-case letters, digits, dots and hyphens, 3 to 63 long).
  else if (!/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/.test(bucket)) problems.push(`NUXT_S3_BUCKET ${JSON.stringify(bucket)} is not a valid bucket name (3–63 lower-case letters, digits, dots or hyphens).`)
  if (!region) problems.push('NUXT_S3_REGION is empty: set the bucket\'s region (S3-compatible servers usually accept us-east-1).')
  if (endpoint) {
    let url: URL | undefined
    try { url = new URL(endpoint) }
    catch {}
    if (!url || !/^https?:$/.test(url.protocol)) problems.push(`NUXT_S3_ENDPOINT ${JSON.stringify(endpoint)} is not an http(s) address.`)
  }
  if (!!accessKeyId !== !!secretAccessKey) problems.push('Set both NUXT_S3_ACCESS_KEY_ID and NUXT_S3_SECRET_ACCESS_KEY, or neither to use the SDK\'s own credentials.')
  const flag = text(config.forcePathStyle).toLowerCase()
  if (!['', 'true', 'false', '1', '0'].includes(flag)) problems.push(`NUXT_S3_FORCE_PATH_STYLE must be true or false, not ${JSON.stringify(flag)}.`)
  if (problems.length) return { options: null, problems }
  return {
    options: { endpoint: endpoint || undefined, region, bucket, accessKeyId: accessKeyId || undefined, secretAccessKey: secretAccessKey || undefined, forcePathStyle: flag === 'true' || flag === '1' },
    problems: [],
  }
}

/** The object is not there (S3 answers NoSuchKey on GET, NotFound on HEAD). */
const isMissing = (error: unknown) => error instanceof S3ServiceException
  && (error.name === 'NoSuchKey' || error.name === 'NotFound' || error.$metadata?.httpStatusCode === 404)
  // A missing bucket is a setup fault, not a missing photo.
  && error.name !== 'NoSuchBucket'

export function s3Storage(options: S3StorageOptions, checkKey: (key: string) => void): PhotoStorage {
  const client = new S3Client({
    endpoint: options.endpoint,
    region: options.region,
    forcePathStyle: options.forcePathStyle,
    credentials: options.accessKeyId && options.secretAccessKey
      ? { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey }
      : undefined,
    // Content-MD5 is sent by us below; the newer default CRC headers are not understood by every
    // S3-compatible server, so the SDK adds them only where an operation requires them.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    // A photo upload is retried by the tablet's queue anyway; keep the server's wait short.
    maxAttempts: 2,
  })
  const Bucket = options.bucket

  async function open(key: string): Promise<StoredPhoto | null> {
    checkKey(key)
    try {
      const answer = await client.send(new GetObjectCommand({ Bucket, Key: key }))
      return {
        body: answer.Body as Readable,
        bytes: Number(answer.ContentLength ?? 0),
        contentType: answer.ContentType,
        sha256: answer.Metadata?.sha256,
      }
    }
    catch (error) {
      if (isMissing(error)) return null
      throw error
    }
  }

  return {
    driver: 's3',
    async put(key, bytes, contentType) {
      checkKey(key)
      await client.send(new PutObjectCommand({
        Bucket,
        Key: key,
        Body: bytes,
        ContentType: contentType,
        ContentLength: bytes.length,
        // S3 refuses the object if the bytes it received do not match (RFC 1864 Content-MD5).
        ContentMD5: createHash('md5').update(bytes).digest('base64'),
        // Kept with the object so a copy can be checked later without the database.
        Metadata: { sha256: createHash('sha256').update(bytes).digest('hex') },
      }))
    },
    async get(key) {
      const found = await open(key)
      if (!found) return null
      const chunks: Buffer[] = []
      for await (const chunk of found.body) chunks.push(Buffer.from(chunk))
      const bytes = Buffer.concat(chunks)
      if (found.sha256 && createHash('sha256').update(bytes).digest('hex') !== found.sha256) {
        throw new Error(`photo ${key} in bucket ${Bucket} does not match its stored sha256`)
      }
      return bytes
    },
    open,
  }
}
