import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { makeEvent, newRunId } from '#shared/runs'
import { useSyncStore } from '~/stores/sync'
import { localStore } from '~/composables/local-store'
import { fitWithin } from '~/utils/photo'

// Photos waiting on the tablet (fake-indexeddb, tests/setup.ts): uploaded before the events,
// deleted only after the server confirmed, kept with the server's reason when refused.

const USER = { id: 7, shopId: 1, name: 'Photo Tester', email: 'p@demo.jogwise.test', role: 'operator' }
const puts: string[] = []
let status: (url: string) => number | 'offline'
let syncBodies: any[] = []

registerEndpoint('/api/sync', {
  method: 'POST',
  handler: async (event) => {
    const { readBody } = await import('h3')
    const body = await readBody(event)
    syncBodies.push(body)
    return { accepted: body.events.map((e: any) => e.id), rejected: [], events: [], cursor: 1 }
  },
})

const photo = (runId: string) => ({ blob: new Uint8Array([0xFF, 0xD8, 0xFF, 0xE0]) as unknown as Blob, runId, contentType: 'image/jpeg', createdAt: '2025-03-01T08:00:00.000Z' })
const photoKeys = async () => (await localStore.keys()).filter(k => k.startsWith('photo:')).sort()

beforeEach(async () => {
  setActivePinia(createPinia())
  useState('nuxt-session').value = { user: USER }
  puts.length = 0
  syncBodies = []
  for (const k of await localStore.keys()) await localStore.del(k)
  vi.stubGlobal('fetch', vi.fn(async (url: string, init: RequestInit) => {
    puts.push(`${init.method} ${url}`)
    const s = status(url)
    if (s === 'offline') throw new TypeError('Failed to fetch')
    return new Response(JSON.stringify(s < 300 ? { id: 'x' } : { message: `Refused with ${s}.` }), { status: s, headers: { 'content-type': 'application/json' } })
  }))
})
// A store's timed replay must not run on into the next test (its photos share IndexedDB).
afterEach(() => { useSyncStore().stop(); vi.unstubAllGlobals() })

describe('photos in the sync store', () => {
  it('uploads a waiting photo before the events and deletes it only once stored', async () => {
    status = () => 201
    const store = useSyncStore()
    const runId = newRunId()
    await store.keepPhoto('0f8a4a8e-5f6c-4a57-9d8e-3d2f3c1b2a10', photo(runId))
    expect(store.photosWaiting).toBe(1)
    await store.load()
    store.queue.push({ event: makeEvent({ runId, actorId: USER.id, deviceId: 'tablet-test' }, 'photo.attached', { stepKey: 'pic', uploadId: '0f8a4a8e-5f6c-4a57-9d8e-3d2f3c1b2a10' }), queuedAt: '', state: 'waiting' })
    await store.flush()
    expect(puts).toEqual([`PUT /api/uploads/0f8a4a8e-5f6c-4a57-9d8e-3d2f3c1b2a10?runId=${runId}`])
    expect(syncBodies).toHaveLength(1)
    expect(await photoKeys()).toEqual([])
    expect(store.photosWaiting).toBe(0)
  })

  it('keeps every photo when the network is down', async () => {
    status = () => 'offline'
    const store = useSyncStore()
    await store.keepPhoto('11111111-1111-4111-8111-111111111111', photo(newRunId()))
    await store.flush()
    expect(await photoKeys()).toEqual(['photo:11111111-1111-4111-8111-111111111111'])
    expect(store.photosWaiting).toBe(1)
    expect(store.photoProblems).toEqual([])
  })

  it('stops at a 401 and sends no events until signed in again', async () => {
    status = () => 401
    const store = useSyncStore()
    await store.keepPhoto('22222222-2222-4222-8222-222222222222', photo(newRunId()))
    await store.flush()
    expect(store.needsSignIn).toBe(true)
    expect(syncBodies).toEqual([])
    expect(await photoKeys()).toHaveLength(1)
  })

  it('keeps a refused photo with the server\'s reason and does not send it again until retried', async () => {
    status = () => 415
    const store = useSyncStore()
    const runId = newRunId()
    await store.keepPhoto('33333333-3333-4333-8333-333333333333', photo(runId))
    await store.flush()
    expect(store.photoProblems).toEqual([{ uploadId: '33333333-3333-4333-8333-333333333333', runId, reason: 'Refused with 415.' }])
    expect(store.photosWaiting).toBe(0)
    await store.flush()
    expect(puts).toHaveLength(1)
    status = () => 201
    await store.retryPhoto('33333333-3333-4333-8333-333333333333')
    await store.flush()
    expect(puts).toHaveLength(2)
    expect(await photoKeys()).toEqual([])
  })

  it('does not count a 404 as refused while the run\'s start is still in the queue', async () => {
    status = () => 404
    const store = useSyncStore()
    const runId = newRunId()
    await store.load()
    // A run started offline: the server answers 404 for its photo until run.started is merged.
    store.queue.push({ event: makeEvent({ runId, actorId: USER.id, deviceId: 'tablet-test' }, 'run.started', { procedureVersionId: 1, machineId: 1, mode: 'solo' }), queuedAt: '', state: 'waiting' })
    await store.keepPhoto('44444444-4444-4444-8444-444444444444', photo(runId))
    const result = await store.uploadPhotos()
    expect(result).toEqual({ signedOut: false, deferred: true })
    expect(store.photoProblems).toEqual([])
    expect(store.photosWaiting).toBe(1)
  })
})

describe('fitWithin', () => {
  // Aspect-preserving scale to a long side of 1600 px: plain proportion, common practice.
  it.each([
    [4032, 3024, { width: 1600, height: 1200 }],
    [3024, 4032, { width: 1200, height: 1600 }],
    [2400, 1200, { width: 1600, height: 800 }],
    [800, 600, { width: 800, height: 600 }],
  ])('%i × %i → %o', (w, h, expected) => {
    expect(fitWithin(w, h)).toEqual(expected)
  })
})
