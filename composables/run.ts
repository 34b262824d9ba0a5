// Each file on its own, not '#shared/runs': that also brings the zod schemas (events.ts), which
// the screen loads only when an event needs a message (buildEvent, issue 14).
import { foldRun } from '#shared/runs/fold'
import { nextAction } from '#shared/runs/next-action'
import { newRunId } from '#shared/runs/event-kinds'
import { buildEvent } from '#shared/runs/event-quick'
import type { RunEvent, RunEventPayload, RunEventType, RunMode } from '#shared/runs'
import type { LengthUnit } from '#shared/machining'
import type { ServerEvent } from '#shared/schemas/sync'
import { mergeServerEvents, readRunSnapshot, withoutServerFields as strip, writeRunSnapshot, type RunSnapshot, type RunVersion } from './run-snapshots'

// A run on this tablet: the exact procedure version it follows, the events the server has,
// and the events still waiting in the queue, folded by shared/runs. The Run screen only renders
// this state and appends events; it never decides rules itself.

export function useRun(runId: string) {
  const sync = useSyncStore()
  const { user } = useUserSession()
  const snapshot = ref<RunSnapshot | null>(null)
  const loadError = ref<string | null>(null)
  const fromCache = ref(false)

  async function load() {
    await sync.load()
    const cached = await readRunSnapshot(runId)
    // The tablet's copy draws the screen at once; it is labelled only if the server cannot answer.
    if (cached) snapshot.value = cached
    try {
      const raw = await $fetch.raw<{ run: { machineId: number }, version: RunVersion, events: ServerEvent[], people: Record<number, string> }>(`/api/runs/${runId}`, { timeout: 8000 })
      const res = raw._data!
      // Offline the service worker answers from its cache with the server's original Date header.
      const servedAt = Date.parse(raw.headers.get('date') ?? '')
      const saved = Number.isFinite(servedAt) && Date.now() - servedAt > 120_000
      const machines = await $fetch<{ id: number, name: string, units: LengthUnit }[]>('/api/machines', { timeout: 8000 }).catch(() => [])
      const machine = machines.find(m => m.id === res.run.machineId)
      // Read the copy again: the sync queue may have added confirmed events while we fetched.
      // A cached answer is older than the copy, so the copy's events win over it; a fresh one wins.
      const copy = (await readRunSnapshot(runId))?.serverEvents ?? []
      const serverEvents = saved ? mergeServerEvents(res.events, copy) : mergeServerEvents(copy, res.events)
      snapshot.value = {
        runId,
        machineId: res.run.machineId,
        machineName: machine?.name ?? cached?.machineName ?? 'Machine',
        machineUnits: machine?.units ?? cached?.machineUnits,
        version: res.version,
        serverEvents,
        people: res.people,
        savedAt: new Date().toISOString(),
      }
      fromCache.value = saved
      await writeRunSnapshot(snapshot.value)
    }
    catch (error: any) {
      // Offline, or the run's start has not reached the server yet: the tablet's copy stands.
      // (A 404 means the run's start is still in this tablet's queue: its copy is the only one.)
      if (snapshot.value) fromCache.value = error?.statusCode !== 404
      else {
        loadError.value = error?.statusCode === 404
          ? 'This run is not on this tablet and the server does not know it.'
          : 'This run is not on this tablet yet, and the server cannot be reached.'
      }
    }
    sync.watch(runId)
  }

  const events = computed<RunEvent[]>(() => {
    const byId = new Map<string, RunEvent>()
    for (const e of snapshot.value?.serverEvents ?? []) byId.set(e.id, strip(e))
    for (const e of sync.incoming[runId] ?? []) byId.set(e.id, strip(e))
    // Refused events are shown apart with their reason; they do not count in the run.
    for (const q of sync.queue) if (q.event.runId === runId && q.state === 'waiting') byId.set(q.event.id, q.event)
    return [...byId.values()]
  })
  const steps = computed(() => snapshot.value?.version.steps ?? [])
  const state = computed(() => foldRun(steps.value, events.value))
  const next = computed(() => nextAction(state.value, steps.value, { actorId: user.value?.id }))
  const refused = computed(() => sync.queue.filter(q => q.event.runId === runId && q.state === 'rejected'))
  /** Flags the server set on stored events (e.g. a late event that passed an open hold). */
  const serverFlags = computed(() => new Map((snapshot.value?.serverEvents ?? []).filter(e => e.flag).map(e => [e.id, e.flag!])))

  /**
   * Appends one event: on the tablet first, then to the server when it can. `fixed` gives the
   * event's id and time when something made earlier names them (a sealed sign-off).
   */
  async function act<T extends RunEventType>(type: T, payload: RunEventPayload<T>, fixed?: Record<string, unknown>) {
    if (!user.value) throw new Error('Sign in first.')
    const id = typeof fixed?.id === 'string' ? fixed.id : undefined
    const at = typeof fixed?.at === 'string' ? fixed.at : undefined
    const event = await buildEvent({ runId, actorId: user.value.id, deviceId: useDeviceId(), id, at }, type, payload)
    await sync.enqueue(event)
    return event
  }

  return { snapshot, loadError, fromCache, events, steps, state, next, refused, serverFlags, load, act }
}

/** Starts a run on this tablet (also offline) and returns its id. */
export async function startRun(args: { machine: { id: number, name: string, units?: LengthUnit }, version: RunVersion, mode: RunMode }) {
  const { user } = useUserSession()
  if (!user.value) throw new Error('Sign in first.')
  const runId = newRunId()
  const snapshot: RunSnapshot = { runId, machineId: args.machine.id, machineName: args.machine.name, machineUnits: args.machine.units, version: args.version, serverEvents: [], savedAt: new Date().toISOString() }
  await writeRunSnapshot(snapshot)
  const event = await buildEvent({ runId, actorId: user.value.id, deviceId: useDeviceId() }, 'run.started', {
    procedureVersionId: args.version.id, machineId: args.machine.id, mode: args.mode,
  })
  await useSyncStore().enqueue(event)
  return runId
}
