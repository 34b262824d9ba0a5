import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { makeEvent, newRunId } from '#shared/runs'
import { useSyncStore } from '~/stores/sync'
import { localStore } from '~/composables/local-store'

// The offline queue against an in-memory IndexedDB (fake-indexeddb, tests/setup.ts) and a
// stand-in /api/sync answer: nothing is removed unless the server accepted it.

const USER = { id: 7, shopId: 1, name: 'Queue Tester', email: 'q@demo.jogwise.test', role: 'operator' }
let answer: (body: any) => { status?: number, json: unknown }
const seen: any[] = []

registerEndpoint('/api/sync', {
  method: 'POST',
  handler: async (event) => {
    const { readBody, setResponseStatus } = await import('h3')
    const body = await readBody(event)
    seen.push(body)
    const { status, json } = answer(body)
    if (status) setResponseStatus(event, status)
    return json
  },
})

const event = (runId: string, n: number) => makeEvent({ runId, actorId: USER.id, deviceId: 'tablet-test' }, 'note.added', { text: `note ${n}` })

beforeEach(async () => {
  setActivePinia(createPinia())
  useState('nuxt-session').value = { user: USER }
  seen.length = 0
  await localStore.del('queue')
  await localStore.del('cursor')
})
// Each test's store is thrown away; its timed replay must not write into the next test's queue.
afterEach(() => useSyncStore().stop())

describe('sync store', () => {
  it('keeps an event in IndexedDB before anything is sent', async () => {
    answer = () => ({ status: 503, json: { message: 'down' } })
    const store = useSyncStore()
    const e = event(newRunId(), 1)
    await store.enqueue(e)
    const saved = await localStore.get<any[]>('queue')
    expect(saved?.map(q => q.event.id)).toEqual([e.id])
  })

  it('removes accepted events, keeps refused ones with the server\'s reason', async () => {
    const runId = newRunId()
    const [a, b] = [event(runId, 1), event(runId, 2)]
    answer = () => ({ json: { accepted: [a.id], rejected: [{ id: b.id, reason: 'No such run.' }], events: [], cursor: 4 } })
    const store = useSyncStore()
    await store.load()
    store.queue.push({ event: a, queuedAt: '', state: 'waiting' }, { event: b, queuedAt: '', state: 'waiting' })
    await store.flush()
    expect(store.queue.map(q => [q.event.id, q.state, q.reason])).toEqual([[b.id, 'rejected', 'No such run.']])
    expect((await localStore.get<any[]>('queue'))?.map(q => q.state)).toEqual(['rejected'])
    expect(store.cursor).toBe(4)
    // A refused event is not sent again until someone retries it.
    const requests = seen.length
    await store.flush()
    expect(seen.slice(requests).flatMap(r => r.events)).toEqual([])
  })

  it('never lets an accepted event vanish from the run, not even for one tick', async () => {
    // The Run screen folds queue ∪ incoming; a gap between the two made it step backwards.
    const runId = newRunId()
    const e = event(runId, 1)
    answer = body => ({ json: { accepted: body.events.map((x: any) => x.id), rejected: [], events: [], cursor: 2 } })
    const store = useSyncStore()
    await store.load()
    store.queue.push({ event: e, queuedAt: '', state: 'waiting' })
    const visible = () => store.queue.some(q => q.event.id === e.id) || (store.incoming[runId] ?? []).some(x => x.id === e.id)
    const gaps: boolean[] = []
    const stop = watchEffect(() => { gaps.push(!visible()) }, { flush: 'sync' })
    await store.flush()
    stop()
    expect(store.queue).toEqual([])
    expect(gaps.some(Boolean)).toBe(false)
  })

  it('says Offline when the server cannot be reached although the browser reports a network', async () => {
    // Shop Wi-Fi up, server out of reach: navigator.onLine stays true, the chip must not say Online.
    const store = useSyncStore()
    await store.load()
    store.queue.push({ event: event(newRunId(), 1), queuedAt: '', state: 'waiting' })
    const real = globalThis.$fetch
    vi.stubGlobal('$fetch', Object.assign(() => Promise.reject(new TypeError('fetch failed')), real))
    try {
      await store.flush()
    }
    finally {
      vi.stubGlobal('$fetch', real)
    }
    expect(store.online).toBe(false)
    expect(store.waiting).toHaveLength(1)
    // An answer with an error status still means the server is there.
    answer = () => ({ status: 503, json: { message: 'down' } })
    await store.flush()
    expect(store.online).toBe(true)
    expect(store.waiting).toHaveLength(1)
  })

  it('waits for a new sign-in after a 401 and loses nothing', async () => {
    answer = () => ({ status: 401, json: { message: 'Sign in first.' } })
    const store = useSyncStore()
    const e = event(newRunId(), 1)
    await store.load()
    store.queue.push({ event: e, queuedAt: '', state: 'waiting' })
    await store.flush()
    expect(store.needsSignIn).toBe(true)
    expect(store.waiting.map(q => q.event.id)).toEqual([e.id])
    const sent = seen.length
    await store.flush()
    expect(seen.length).toBe(sent)
  })

  it('sends at most 500 events per request and only the signed-in person\'s', async () => {
    answer = body => ({ json: { accepted: body.events.map((x: any) => x.id), rejected: [], events: [], cursor: 1 } })
    const store = useSyncStore()
    await store.load()
    const runId = newRunId()
    for (let i = 0; i < 620; i++) store.queue.push({ event: event(runId, i), queuedAt: '', state: 'waiting' })
    const other = makeEvent({ runId, actorId: 99, deviceId: 'tablet-test' }, 'note.added', { text: 'someone else' })
    store.queue.push({ event: other, queuedAt: '', state: 'waiting' })
    await store.flush()
    expect(seen[0].events).toHaveLength(500)
    expect(seen[0].events.every((e: any) => e.actorId === USER.id)).toBe(true)
    await store.flush()
    expect(store.queue.map(q => q.event.id)).toEqual([other.id])
  })

  it('sends the next batch at once when more waits than one batch holds, not at the next interval', async () => {
    answer = body => ({ json: { accepted: body.events.map((x: any) => x.id), rejected: [], events: [], cursor: 1 } })
    const store = useSyncStore()
    await store.load()
    const runId = newRunId()
    for (let i = 0; i < 520; i++) store.queue.push({ event: event(runId, i), queuedAt: '', state: 'waiting' })
    store.start()
    // The regular interval is 20 s; both batches must be out long before that.
    await vi.waitFor(() => expect(store.queue).toEqual([]), { timeout: 5000, interval: 50 })
    expect(seen.map(r => r.events.length)).toEqual([500, 20])
  })
})
