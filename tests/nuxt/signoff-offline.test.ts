import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { makeEvent, newRunId } from '#shared/runs'
import { useSyncStore } from '~/stores/sync'
import { localStore } from '~/composables/local-store'
import { useTabletProgress } from '~/composables/floor-offline'
import { STEPS } from '../unit/runs/fixtures'

// The tablet side of issue 11: a sealed sign-off is replaced by the server's verdict copy once
// synced (the seal is not kept), and offline the Floor shows each run at the tablet's own step.

const USER = { id: 7, shopId: 1, name: 'Floor Tester', email: 'f@demo.jogwise.test', role: 'trainee' }
let answer: (body: any) => unknown = () => ({ accepted: [], rejected: [], events: [], cursor: 0 })
registerEndpoint('/api/sync', { method: 'POST', handler: async (event) => {
  const { readBody } = await import('h3')
  return answer(await readBody(event))
} })

const ctx = (runId: string, sec: number) => ({ runId, actorId: USER.id, deviceId: 'tablet-floor', at: new Date(Date.UTC(2026, 2, 1, 8, 0, sec)) })

beforeEach(async () => {
  setActivePinia(createPinia())
  useState('nuxt-session').value = { user: USER }
  await localStore.del('queue')
  await localStore.del('cursor')
})
afterEach(() => useSyncStore().stop())

describe('offline sign-off on the tablet', () => {
  it('keeps the server\'s verdict copy of a sealed sign-off, not the tablet\'s sealed one', async () => {
    const runId = newRunId()
    const signed = makeEvent(ctx(runId, 5), 'signoff.given', { stepKey: 'isolate', signerId: 3, signerRole: 'trainer', seal: 'js1.k.a.b.c' })
    const { seal: _seal, ...stored } = signed
    answer = () => ({ accepted: [signed.id], rejected: [], events: [{ ...stored, verdict: { status: 'verified' }, seq: 9, flag: null }], cursor: 9 })
    const store = useSyncStore()
    await store.enqueue(signed)
    await vi.waitFor(() => expect(store.queue).toHaveLength(0))
    expect(store.incoming[runId]).toEqual([{ ...stored, verdict: { status: 'verified' }, seq: 9, flag: null }])
  })

  it('shows each run at the step the tablet reached, from its queue', async () => {
    const runId = newRunId()
    const started = makeEvent(ctx(runId, 0), 'run.started', { procedureVersionId: 1, machineId: 1, mode: 'guided' })
    await localStore.set(`run:${runId}`, {
      runId, machineId: 1, machineName: 'Bench', savedAt: '',
      version: { id: 1, procedureId: 1, version: 1, title: 'Fold test procedure', summary: '', steps: JSON.parse(JSON.stringify(STEPS)) },
      serverEvents: [{ ...started, seq: 1, flag: null }],
    })
    answer = () => new Promise(() => {}) // the server never answers: offline
    const store = useSyncStore()
    await store.load()
    store.queue.push(
      { event: makeEvent(ctx(runId, 1), 'step.done', { stepKey: 'intro' }), queuedAt: '', state: 'waiting' },
      { event: makeEvent(ctx(runId, 2), 'hold.acknowledged', { stepKey: 'gear' }), queuedAt: '', state: 'waiting' },
    )
    const progress = useTabletProgress(ref([runId]))
    await vi.waitFor(() => expect(progress.value.get(runId)).toMatchObject({ id: runId, machineId: 1, currentStepNumber: 3, currentStepTitle: 'Isolate the power', stepCount: STEPS.length, finished: false, startedByName: USER.name }))
  })
})
