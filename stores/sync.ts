import { acceptHMRUpdate, defineStore } from 'pinia'
import type { RunEvent } from '#shared/runs'
import type { ServerEvent, SyncResponse } from '#shared/schemas/sync'
import { MAX_SYNC_EVENTS } from '#shared/schemas/sync-limits'
import { nextDelay } from '~/utils/backoff'
import { usePhotoQueueStore } from './photo-queue'

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

// The photo queue and the tablet's run copies live beside it (stores/photo-queue.ts,
// composables/run-snapshots.ts); this store sends both queues and adds what the server
// confirmed to the run copies.
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
  const networkUp = useNetworkUp()
  const reachable = ref(true)
  const online = computed(() => networkUp.value && reachable.value)
  const photoQueue = usePhotoQueueStore()
  const { waiting: photosWaiting, problems: photoProblems } = storeToRefs(photoQueue)
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
    await photoQueue.refresh()
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
      await addToRunSnapshots(confirmed)
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
      if (error?.statusCode === 401 || error?.response?.status === 401) signedOut()
      else {
        lastError.value = error?.data?.message ?? 'The server could not be reached.'
        schedule(nextDelay(failures.value))
      }
    }
    finally {
      sending.value = false
    }
  }

  const signedOut = () => {
    needsSignIn.value = true
    lastError.value = 'Signed out: sign in again to send the waiting entries.'
  }

  /** Sends the waiting photos; a photo of a run whose start is still queued waits for it. */
  async function uploadPhotos() {
    const startWaits = (runId: string) => queue.value.some(q => q.event.runId === runId && q.event.type === 'run.started' && q.state === 'waiting')
    const result = await photoQueue.upload(startWaits)
    if (result.signedOut) signedOut()
    return result
  }

  const keepPhoto = photoQueue.keep

  /** Sends a refused photo again, e.g. after its run reached the server. */
  async function retryPhoto(uploadId: string) {
    await photoQueue.retry(uploadId)
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
