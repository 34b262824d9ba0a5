import { createReadStream } from 'node:fs'
import { mkdir, readFile, rename, stat, writeFile } from 'node:fs/promises'
import { dirname, join, resolve, sep } from 'node:path'
import { randomUUID } from 'node:crypto'
import type { Readable } from 'node:stream'
import { s3OptionsFrom, s3Storage, type S3Config } from './storage-s3'

// Photo evidence goes through one small interface so the local-disk default can be swapped for
// another driver without touching the routes. Keys are always made by the server
// (`<shopId>/<uploadId>.<ext>`); nothing the client sends is ever used as a path.

export interface PhotoStorage {
  readonly driver: 'local' | 's3'
  put(key: string, bytes: Buffer, contentType: string): Promise<void>
  /** The whole photo, or null when there is none under the key. */
  get(key: string): Promise<Buffer | null>
  /** The photo as a stream, so a download never holds the whole file in memory. */
  open(key: string): Promise<StoredPhoto | null>
}

export interface StoredPhoto {
  body: Readable
  bytes: number
  contentType?: string
  /** Hex sha256 kept beside the object, where the driver keeps one. */
  sha256?: string
}

/** The largest photo accepted, after the tablet has already scaled it down. */
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024

export const PHOTO_TYPES = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
} as const
export type PhotoType = keyof typeof PHOTO_TYPES

const startsWith = (bytes: Uint8Array, sig: number[], at = 0) => sig.every((b, i) => bytes[at + i] === b)

/**
 * The image type by the file's own first bytes, never by its name or the claimed content type:
 * JPEG starts FF D8 FF (the SOI marker of ITU-T T.81 and the first marker segment), PNG with its
 * 8-byte signature (W3C PNG specification, "PNG signature"), WebP with a RIFF header whose form
 * type is "WEBP" (RFC 9649, WebP image format).
 */
export function sniffPhotoType(bytes: Uint8Array): PhotoType | null {
  if (startsWith(bytes, [0xFF, 0xD8, 0xFF])) return 'image/jpeg'
  if (startsWith(bytes, [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A])) return 'image/png'
  if (bytes.length >= 12 && startsWith(bytes, [0x52, 0x49, 0x46, 0x46]) && startsWith(bytes, [0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp'
  return null
}

/** The one way a storage key is made. */
export function photoKey(shopId: number, uploadId: string, type: PhotoType) {
  return `${shopId}/${uploadId}.${PHOTO_TYPES[type]}`
}

const KEY_PATTERN = /^\d+\/[0-9a-f-]{36}\.(?:jpg|png|webp)$/

/** Every driver refuses a key that photoKey could not have made. */
export function checkPhotoKey(key: string) {
  if (!KEY_PATTERN.test(key)) throw new Error(`refused storage key ${JSON.stringify(key)}`)
}

/** Local disk under one folder; a key that could leave it is refused outright. */
export function diskStorage(root: string): PhotoStorage {
  const base = resolve(root)
  const pathOf = (key: string) => {
    checkPhotoKey(key)
    const full = resolve(base, key)
    if (!full.startsWith(base + sep)) throw new Error(`refused storage key ${JSON.stringify(key)}`)
    return full
  }
  return {
    driver: 'local',
    async put(key, bytes) {
      const full = pathOf(key)
      await mkdir(dirname(full), { recursive: true })
      // Written aside and renamed, so a crash never leaves half a photo under the real name.
      const temp = `${full}.${randomUUID()}.part`
      await writeFile(temp, bytes)
      await rename(temp, full)
    },
    async get(key) {
      try {
        return await readFile(pathOf(key))
      }
      catch (error: any) {
        if (error?.code === 'ENOENT') return null
        throw error
      }
    },
    async open(key) {
      const full = pathOf(key)
      try {
        const { size } = await stat(full)
        return { body: createReadStream(full), bytes: size }
      }
      catch (error: any) {
        if (error?.code === 'ENOENT') return null
        throw error
      }
    },
  }
}

/** The driver and its settings problems, decided once from runtime config. */
export function photoStorageFrom(config: { storageDriver?: unknown, uploadsDir?: unknown, s3?: S3Config }): { storage: PhotoStorage, problems: [] } | { storage: null, problems: string[] } {
  const driver = String(config.storageDriver ?? '').trim().toLowerCase()
  if (driver === '' || driver === 'local') {
    const dir = String(config.uploadsDir ?? '').trim() || join(process.cwd(), '.data', 'uploads')
    return { storage: diskStorage(dir), problems: [] }
  }
  if (driver === 's3') {
    const { options, problems } = s3OptionsFrom(config.s3 ?? {})
    return options ? { storage: s3Storage(options, checkPhotoKey), problems: [] } : { storage: null, problems }
  }
  return { storage: null, problems: [`NUXT_STORAGE_DRIVER ${JSON.stringify(driver)} is unknown: use local or s3.`] }
}

const unavailable = (message: string) => createError({ statusCode: 503, statusMessage: 'Service unavailable', message })

/**
 * Driver failures (S3 down, bucket gone, access refused) are logged here in full and reach the
 * tablet only as a 503 in plain words: its queue keeps the photo and sends it again later.
 */
function guarded(inner: PhotoStorage): PhotoStorage {
  const wrap = <A extends unknown[], R>(what: string, fn: (...args: A) => Promise<R>) => async (...args: A) => {
    try { return await fn(...args) }
    catch (error: any) {
      console.error(`[jogwise] photo storage (${inner.driver}) failed to ${what} ${JSON.stringify(args[0])}:`, error?.name ?? '', error?.message ?? error)
      throw unavailable(what === 'store'
        ? 'The photo store did not take the photo just now; the tablet keeps it and sends it again.'
        : 'The photo store did not answer just now; try again in a moment.')
    }
  }
  return { driver: inner.driver, put: wrap('store', inner.put), get: wrap('read', inner.get), open: wrap('read', inner.open) }
}

let chosen: ReturnType<typeof photoStorageFrom> | undefined

/** Decides the driver once per server process and logs what was chosen, or why none could be. */
export function choosePhotoStorage() {
  if (!chosen) {
    const config = useRuntimeConfig()
    const found = photoStorageFrom(config)
    chosen = found.storage ? { storage: guarded(found.storage), problems: [] } : found
    if (chosen.storage) {
      const where = chosen.storage.driver === 's3' ? `bucket ${config.s3.bucket}${config.s3.endpoint ? ` at ${config.s3.endpoint}` : ''}` : 'local disk'
      console.info(`[jogwise] photo storage: ${where}`)
    }
    else {
      console.error(`[jogwise] photo storage is not set up, photo uploads will answer 503:\n  - ${chosen.problems.join('\n  - ')}`)
    }
  }
  return chosen
}

/** The storage for this server process: local disk (runtime config `uploadsDir`) or S3. */
export function usePhotoStorage(): PhotoStorage {
  const { storage } = choosePhotoStorage()
  if (!storage) throw unavailable('Photo storage is not set up on this server, so photos cannot be stored or shown; the server log names the setting to fix.')
  return storage
}
