import { acceptHMRUpdate, defineStore } from 'pinia'
import type { RunEvent } from '#shared/runs'
import type { ServerEvent, SyncResponse } from '#shared/schemas/sync'
import { MAX_SYNC_EVENTS } from '#shared/schemas/sync-limits'
import { nextDelay } from '~/utils/backoff'

// The offline queue. Every run event is written to IndexedDB before anything else happens,
// then replayed to POST /api/sync in batches when the network allows: on coming online, on an
// interval, on demand, with exponential backoff and jitter after failures. Events the server
// refuses stay here with its reason; nothing is ever removed unless the server accepted it.

export interface QueuedEvent {
  event: RunEvent
  /** Extra fields the server needs but the fold does not. */
  extra?: Record<string, unknown>
  queuedAt: string
  state: 'waiting' | 'rejected'
  reason?: string
}

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

export const PHOTO_PREFIX = 'photo:'
const QUEUE_KEY = 'queue'
const CURSOR_KEY = 'cursor'
const LAST_SYNC_KEY = 'last-sync'
const INTERVAL_MS = 20_000

export const useSyncStore = defineStore('sync', () => {
  const queue = ref<QueuedEvent[]>([])
  const loaded = ref(false)
  const sending = ref(false)
  const lastSyncAt = ref<string | null>(null)
  const lastError = ref<string | null>(null)
  const needsSignIn = ref(false)
  const failures = ref(0)
  const cursor = ref(0)
  const watched = ref<Set<string>>(new Set())
  /** Server events per run that arrived through sync, for the run views to merge. */
  const incoming = ref<Record<string, ServerEvent[]>>({})
  // The browser's own flag says only that a network is there; shop Wi-Fi can be up with the
  // server out of reach. The chip says Online only when both hold.
  const networkUp = useOnline()
  const reachable = ref(true)
  const online = computed(() => networkUp.value && reachable.value)
  let timer: ReturnType<typeof setTimeout> | undefined
  let writing: Promise<unknown> = Promise.resolve()

  const waiting = computed(() => queue.value.filter(q => q.state === 'waiting'))
  const rejected = computed(() => queue.value.filter(q => q.state === 'rejected'))

  // Writes are chained so two quick taps can never overwrite each other's copy.
  function persist() {
    const snapshot = JSON.parse(JSON.stringify(queue.value)) as QueuedEvent[]
    writing = writing.then(() => localStore.set(QUEUE_KEY, snapshot))
    return writing
  }

  async function load() {
    if (loaded.value || import.meta.server) return
    queue.value = (await localStore.get<QueuedEvent[]>(QUEUE_KEY)) ?? []
    cursor.value = (await localStore.get<number>(CURSOR_KEY)) ?? 0
    lastSyncAt.value = (await localStore.get<string>(LAST_SYNC_KEY)) ?? null
    await refreshPhotos()
    loaded.value = true
  }

  /** Stores the event on the tablet first; the returned promise resolves once it is safe. */
  async function enqueue(event: RunEvent, extra?: Record<string, unknown>) {
    await load()
    queue.value.push({ event, extra, queuedAt: new Date().toISOString(), state: 'waiting' })
    await persist()
    schedule(0)
  }

  /** Follows a run's events from other tablets; a newly followed run is asked for at once. */
  function watch(runId: string) {
    if (watched.value.has(runId)) return
    watched.value.add(runId)
    schedule(0)
  }

  async function flush() {
    await load()
    const { user } = useUserSession()
    if (sending.value || !networkUp.value || needsSignIn.value || !user.value) return
    // Photos go before the events, so an event naming an upload finds it stored.
    const photos = await uploadPhotos()
    if (photos.signedOut) return
    // Only the signed-in person's events can be sent with their session.
    const batch = waiting.value.filter(q => q.event.actorId === user.value!.id).slice(0, MAX_SYNC_EVENTS)
    // With nothing to send, a request still goes out while the server seemed out of reach, so
    // the chip finds out it is back.
    if (!batch.length && !watched.value.size && reachable.value) return
    sending.value = true
    try {
      const res = await $fetch<SyncResponse>('/api/sync', {
        method: 'POST',
        body: {
          deviceId: useDeviceId(),
          since: cursor.value,
          watch: [...watched.value].slice(0, 50),
          events: batch.map(q => ({ ...q.event, ...q.extra })),
        },
        timeout: 15_000,
      })
      const accepted = new Set(res.accepted)
      const reasons = new Map(res.rejected.map(r => [r.id, r.reason]))
      // What the server now holds (our accepted events and others' new ones) joins each run's
      // copy on the tablet, so a reload offline still shows it. It joins in the same tick as
      // it leaves the queue: in between, the Run screen would fold without it and step back.
      // A sign-off comes back with the server's verdict in place of its seal; that copy wins.
      const returned = new Set(res.events.map(e => e.id))
      const confirmed: ServerEvent[] = [
        ...batch.filter(q => accepted.has(q.event.id) && !returned.has(q.event.id)).map(q => ({ ...q.event, seq: 0, flag: null }) as ServerEvent),
        ...res.events,
      ]
      for (const e of confirmed) (incoming.value[e.runId] ??= []).push(e)
      queue.value = queue.value
        .filter(q => !accepted.has(q.event.id))
        .map(q => reasons.has(q.event.id) ? { ...q, state: 'rejected' as const, reason: reasons.get(q.event.id) } : q)
      await persist()
      await saveToSnapshots(confirmed)
      cursor.value = Math.max(cursor.value, res.cursor)
      await localStore.set(CURSOR_KEY, cursor.value)
      lastSyncAt.value = new Date().toISOString()
      await localStore.set(LAST_SYNC_KEY, lastSyncAt.value)
      lastError.value = null
      reachable.value = true
      failures.value = 0
      // More left than one batch holds, or a photo waited for its run to reach the server: go on at once.
      if (waiting.value.some(q => q.event.actorId === user.value!.id) || photos.deferred) schedule(0)
    }
    catch (error: any) {
      failures.value++
      // No answer at all (not even an error status) means the server is out of reach.
      reachable.value = Boolean(error?.response)
      if (error?.statusCode === 401 || error?.response?.status === 401) {
        needsSignIn.value = true
        lastError.value = 'Signed out: sign in again to send the waiting entries.'
      }
      else {
        lastError.value = error?.data?.message ?? 'The server could not be reached.'
        schedule(nextDelay(failures.value))
      }
    }
    finally {
      sending.value = false
    }
  }

  async function saveToSnapshots(events: ServerEvent[]) {
    const byRun = new Map<string, ServerEvent[]>()
    for (const e of events) byRun.set(e.runId, [...(byRun.get(e.runId) ?? []), e])
    for (const [runId, list] of byRun) {
      const snap = await localStore.get<{ serverEvents: ServerEvent[] }>(`run:${runId}`)
      if (!snap) continue
      const known = new Set(snap.serverEvents.map(e => e.id))
      snap.serverEvents.push(...list.filter(e => !known.has(e.id)))
      await localStore.set(`run:${runId}`, snap)
    }
  }

  // --- Photos waiting for the network ---------------------------------------------------------
  // Each photo is its own IndexedDB entry (a blob is too big to rewrite with the queue) and is
  // deleted only after the server confirmed it stored the photo.
  const photosWaiting = ref(0)
  const photoProblems = ref<PhotoProblem[]>([])
  let uploading = false

  async function refreshPhotos() {
    if (import.meta.server) return
    let count = 0
    const problems: PhotoProblem[] = []
    for (const key of await localStore.keys()) {
      if (!key.startsWith(PHOTO_PREFIX)) continue
      const photo = await localStore.get<WaitingPhoto>(key)
      if (!photo) continue
      if (photo.rejectedReason) problems.push({ uploadId: key.slice(PHOTO_PREFIX.length), runId: photo.runId, reason: photo.rejectedReason })
      else count++
    }
    photosWaiting.value = count
    photoProblems.value = problems
  }

  /** Keeps a photo on the tablet; call before recording the event that names it. */
  async function keepPhoto(uploadId: string, photo: WaitingPhoto) {
    await localStore.set(PHOTO_PREFIX + uploadId, photo)
    await refreshPhotos()
  }

  async function uploadPhotos(): Promise<{ signedOut: boolean, deferred: boolean }> {
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
        if (res.status === 401) {
          needsSignIn.value = true
          lastError.value = 'Signed out: sign in again to send the waiting entries.'
          result.signedOut = true
          break
        }
        // A run started offline is unknown to the server until its first event is merged.
        if (res.status === 404 && queue.value.some(q => q.event.runId === photo.runId && q.event.type === 'run.started' && q.state === 'waiting')) {
          result.deferred = true
          continue
        }
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
      await refreshPhotos()
    }
    return result
  }

  /** Sends a refused photo again, e.g. after its run reached the server. */
  async function retryPhoto(uploadId: string) {
    const photo = await localStore.get<WaitingPhoto>(PHOTO_PREFIX + uploadId)
    if (!photo) return
    const { rejectedReason: _reason, ...rest } = photo
    await localStore.set(PHOTO_PREFIX + uploadId, rest)
    await refreshPhotos()
    schedule(0)
  }

  function schedule(ms: number) {
    if (import.meta.server) return
    clearTimeout(timer)
    // The regular interval follows only if the flush set no sooner time itself (more to send at
    // once, or its backoff after a failure).
    const mine = setTimeout(() => { flush().finally(() => { if (timer === mine) schedule(INTERVAL_MS) }) }, ms)
    timer = mine
  }

  /** Stops the timed replay (a store that is thrown away, as between tests, must not go on). */
  function stop() {
    clearTimeout(timer)
    timer = undefined
  }

  /** After signing in again the replay continues where it stopped. */
  function resume() {
    needsSignIn.value = false
    failures.value = 0
    schedule(0)
  }

  /** Puts a refused event back in line, e.g. after the reason was dealt with. */
  async function retry(id: string) {
    queue.value = queue.value.map(q => q.event.id === id ? { ...q, state: 'waiting' as const, reason: undefined } : q)
    await persist()
    schedule(0)
  }

  function start() {
    if (import.meta.server) return
    // Signed in from the tablet's memory means the server could not be asked at page load.
    if (useState('jogwise-offline-session').value) reachable.value = false
    load().then(() => schedule(0))
    watchEffect(() => { if (networkUp.value) schedule(0) })
  }

  return {
    queue, waiting, rejected, loaded, sending, lastSyncAt, lastError, needsSignIn, online, incoming, cursor, load, enqueue, flush, resume, retry, start, stop, watch,
    photosWaiting, photoProblems, keepPhoto, uploadPhotos, retryPhoto,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useSyncStore, import.meta.hot))
