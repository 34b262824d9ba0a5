import { mkdir, readFile, rename, writeFile } from 'node:fs/promises'
import { dirname, join, resolve, sep } from 'node:path'
import { randomUUID } from 'node:crypto'

// Photo evidence goes through one small interface so the local-disk default can be swapped for
// another driver without touching the routes. Keys are always made by the server
// (`<shopId>/<uploadId>.<ext>`); nothing the client sends is ever used as a path.

export interface PhotoStorage {
  put(key: string, bytes: Buffer, contentType: string): Promise<void>
  get(key: string): Promise<Buffer | null>
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

/** Local disk under one folder; a key that could leave it is refused outright. */
export function diskStorage(root: string): PhotoStorage {
  const base = resolve(root)
  const pathOf = (key: string) => {
    const full = resolve(base, key)
    if (!KEY_PATTERN.test(key) || !full.startsWith(base + sep)) throw new Error(`refused storage key ${JSON.stringify(key)}`)
    return full
  }
  return {
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
  }
}

let storage: PhotoStorage | undefined

/** The storage for this server process: local disk under runtime config `uploadsDir`. */
export function usePhotoStorage(): PhotoStorage {
  if (!storage) {
    const dir = useRuntimeConfig().uploadsDir || join(process.cwd(), '.data', 'uploads')
    storage = diskStorage(dir)
  }
  return storage
}
