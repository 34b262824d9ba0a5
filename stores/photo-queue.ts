import { acceptHMRUpdate, defineStore } from 'pinia'

// Photos waiting for the network. Each photo is its own IndexedDB entry (a blob is too big to
// rewrite with the event queue) and is deleted only after the server confirmed it stored it.
// The sync store sends them before the events that name them.

/** A photo kept on the tablet until the server has stored it (key `photo:<uploadId>`). */
export interface WaitingPhoto {
  blob: Blob
  runId: string
  contentType: string
  createdAt: string
  /** The server's reason when it refused the photo; it stays until someone retries. */
  rejectedReason?: string
}
export interface PhotoProblem { uploadId: string, runId: string, reason: string }
export interface PhotoUploadResult { signedOut: boolean, deferred: boolean }

export const PHOTO_PREFIX = 'photo:'

export const usePhotoQueueStore = defineStore('photo-queue', () => {
  const waiting = ref(0)
  const problems = ref<PhotoProblem[]>([])
  let uploading = false

  async function refresh() {
    if (import.meta.server) return
    let count = 0
    const found: PhotoProblem[] = []
    for (const key of await localStore.keys()) {
      if (!key.startsWith(PHOTO_PREFIX)) continue
      const photo = await localStore.get<WaitingPhoto>(key)
      if (!photo) continue
      if (photo.rejectedReason) found.push({ uploadId: key.slice(PHOTO_PREFIX.length), runId: photo.runId, reason: photo.rejectedReason })
      else count++
    }
    waiting.value = count
    problems.value = found
  }

  /** Keeps a photo on the tablet; call before recording the event that names it. */
  async function keep(uploadId: string, photo: WaitingPhoto) {
    await localStore.set(PHOTO_PREFIX + uploadId, photo)
    await refresh()
  }

  /**
   * Sends every waiting photo. `startWaits(runId)`: the run's start is still in this tablet's
   * queue, so the server cannot know the run yet and its 404 is not a refusal.
   */
  async function upload(startWaits: (runId: string) => boolean): Promise<PhotoUploadResult> {
    const result = { signedOut: false, deferred: false }
    if (uploading) return result
    uploading = true
    try {
      for (const key of await localStore.keys()) {
        if (!key.startsWith(PHOTO_PREFIX)) continue
        const photo = await localStore.get<WaitingPhoto>(key)
        if (!photo || photo.rejectedReason) continue
        const uploadId = key.slice(PHOTO_PREFIX.length)
        let res: Response
        try {
          res = await fetch(`/api/uploads/${uploadId}?runId=${encodeURIComponent(photo.runId)}`, {
            method: 'PUT',
            headers: { 'content-type': photo.contentType, 'accept': 'application/json' },
            body: photo.blob,
            signal: AbortSignal.timeout(60_000),
          })
        }
        catch {
          break // No network: every photo stays for the next flush.
        }
        if (res.ok) { await localStore.del(key); continue }
        if (res.status === 401) { result.signedOut = true; break }
        if (res.status === 404 && startWaits(photo.runId)) { result.deferred = true; continue }
        if (res.status >= 400 && res.status < 500) {
          const answer = await res.json().catch(() => null)
          await localStore.set(key, { ...photo, rejectedReason: answer?.message || `The server refused the photo (${res.status}).` })
          continue
        }
        break // A server error: try again later.
      }
    }
    finally {
      uploading = false
      await refresh()
    }
    return result
  }

  /** Puts a refused photo back in line, e.g. after its run reached the server. */
  async function retry(uploadId: string) {
    const photo = await localStore.get<WaitingPhoto>(PHOTO_PREFIX + uploadId)
    if (!photo) return
    const { rejectedReason: _reason, ...rest } = photo
    await localStore.set(PHOTO_PREFIX + uploadId, rest)
    await refresh()
  }

  return { waiting, problems, refresh, keep, upload, retry }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(usePhotoQueueStore, import.meta.hot))
