// Tablet cameras take 12-megapixel pictures of several MB; evidence needs far less. The photo
// is scaled down on the tablet before it is kept, so IndexedDB and the shop Wi-Fi carry ~200 kB.

export const PHOTO_MAX_SIDE = 1600
export const PHOTO_QUALITY = 0.8

/** Width and height that fit within `maxSide` on the long side, keeping the aspect ratio; never enlarged. */
export function fitWithin(width: number, height: number, maxSide = PHOTO_MAX_SIDE) {
  const scale = Math.min(1, maxSide / Math.max(width, height))
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) }
}

/** Decodes a picture (turned upright from its orientation tag) and re-encodes it as a smaller JPEG. */
export async function downscalePhoto(file: Blob, maxSide = PHOTO_MAX_SIDE, quality = PHOTO_QUALITY) {
  let bitmap: ImageBitmap
  try {
    bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' })
  }
  catch {
    throw new Error('This picture could not be read. Take it again, or choose a JPEG or PNG.')
  }
  const size = fitWithin(bitmap.width, bitmap.height, maxSide)
  let blob: Blob | null
  if (typeof OffscreenCanvas !== 'undefined') {
    const canvas = new OffscreenCanvas(size.width, size.height)
    canvas.getContext('2d')!.drawImage(bitmap, 0, 0, size.width, size.height)
    blob = await canvas.convertToBlob({ type: 'image/jpeg', quality })
  }
  else {
    const canvas = document.createElement('canvas')
    Object.assign(canvas, size)
    canvas.getContext('2d')!.drawImage(bitmap, 0, 0, size.width, size.height)
    blob = await new Promise<Blob | null>(done => canvas.toBlob(done, 'image/jpeg', quality))
  }
  bitmap.close()
  if (!blob) throw new Error('The picture could not be made smaller on this tablet.')
  return { blob, ...size }
}
