import { describe, expect, it } from 'vitest'
import type { ServerEvent } from '#shared/schemas/sync'
import { mergeServerEvents } from '~/composables/run-snapshots'

// The tablet's copy of a run against an older or newer answer from the server: no event the
// server holds is ever dropped, because the server never deletes one.

const ev = (id: string, seq: number, flag: string | null = null) =>
  ({ id, runId: 'r1', seq, flag, type: 'note.added', actorId: 1, deviceId: 'd', at: '2026-01-01T00:00:00.000Z', payload: { text: id } }) as unknown as ServerEvent

describe('mergeServerEvents', () => {
  it('keeps the copy\'s events that a cached (older) answer does not have', () => {
    const cachedAnswer = [ev('a', 1)]
    const copy = [ev('a', 1), ev('b', 2), ev('c', 3)]
    expect(mergeServerEvents(cachedAnswer, copy).map(e => e.id)).toEqual(['a', 'b', 'c'])
  })

  it('lets the newer list\'s copy of an event win (a re-flagged event)', () => {
    const merged = mergeServerEvents([ev('a', 1), ev('b', 2)], [ev('b', 2, 'late-past-hold')])
    expect(merged.find(e => e.id === 'b')!.flag).toBe('late-past-hold')
    expect(merged).toHaveLength(2)
  })

  it('never lets the tablet\'s stand-in (seq 0) replace a copy the server sent', () => {
    const merged = mergeServerEvents([ev('a', 5, 'x')], [ev('a', 0)])
    expect(merged[0]).toMatchObject({ seq: 5, flag: 'x' })
  })

  it('orders by the server\'s sequence, stand-ins last', () => {
    const merged = mergeServerEvents([ev('z', 0), ev('c', 3)], [ev('a', 1), ev('b', 2)])
    expect(merged.map(e => e.id)).toEqual(['a', 'b', 'c', 'z'])
  })
})
