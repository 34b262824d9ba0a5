import { foldRun } from '#shared/runs/fold'
import type { RunEvent } from '#shared/runs'
import type { DueItem } from '~~/server/utils/due-list'
import { readRunSnapshot, withoutServerFields, type RunSnapshot } from './run-snapshots'

const DUE_KEY = 'floor-due'

/**
 * The due list for the Floor's badges. Each answer from the server is kept on the tablet, so
 * offline (no answer, or only an error) the badges stay as they last were.
 */
export function useFloorDue() {
  const { data, error } = useDue()
  const kept = ref<DueItem[] | null>(null)
  if (import.meta.client) {
    onMounted(async () => { kept.value = (await localStore.get<DueItem[]>(DUE_KEY)) ?? null })
    watch(data, (items) => {
      if (!error.value && items) localStore.set(DUE_KEY, JSON.parse(JSON.stringify(items)))
    }, { immediate: true })
  }
  return computed<DueItem[]>(() => (error.value && kept.value ? kept.value : data.value ?? []))
}

export interface TabletProgress { currentStepNumber: number | null, currentStepTitle: string | null, stepCount: number }
/** A run this tablet has work queued for, as a Floor tile shows it. */
export interface TabletRun extends TabletProgress { id: string, machineId: number, procedureTitle: string, mode: string, startedByName: string, finished: boolean }

/**
 * Where this tablet has each run got to: the run's saved copy folded with the events still in
 * the queue. Offline, the server's list of open runs is an older copy; the tablet's own latest
 * step is what the person at the machine last did, so the Floor shows that.
 */
export function useTabletProgress(runIds: Ref<string[]>) {
  const sync = useSyncStore()
  const snapshots = ref<Record<string, RunSnapshot>>({})
  if (import.meta.client) {
    watch([runIds, () => sync.queue.length], async () => {
      await sync.load()
      const wanted = new Set([...runIds.value, ...sync.waiting.map(q => q.event.runId)])
      for (const id of wanted) {
        if (snapshots.value[id]) continue
        const snap = await readRunSnapshot(id)
        if (snap) snapshots.value = { ...snapshots.value, [id]: snap }
      }
    }, { immediate: true })
  }
  const { user } = useUserSession()
  return computed(() => {
    const out = new Map<string, TabletRun>()
    for (const [id, snap] of Object.entries(snapshots.value)) {
      const queued = sync.waiting.filter(q => q.event.runId === id)
      if (!queued.length) continue
      const byId = new Map<string, RunEvent>()
      for (const e of [...snap.serverEvents, ...(sync.incoming[id] ?? [])]) byId.set(e.id, withoutServerFields(e))
      for (const q of queued) byId.set(q.event.id, q.event)
      const state = foldRun(snap.version.steps, [...byId.values()])
      const current = state.steps[state.currentStepIndex]
      const starter = state.started?.actorId
      out.set(id, {
        id, machineId: snap.machineId, procedureTitle: snap.version.title, mode: state.mode ?? 'guided', finished: state.status !== 'active',
        startedByName: (starter !== undefined && (snap.people?.[starter] ?? (starter === user.value?.id ? user.value?.name : undefined))) || 'Someone',
        currentStepNumber: current ? state.currentStepIndex + 1 : null, currentStepTitle: current?.title ?? null, stepCount: state.steps.length,
      })
    }
    return out
  })
}
