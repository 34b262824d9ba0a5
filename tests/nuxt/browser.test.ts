import { afterEach, describe, expect, it, vi } from 'vitest'
import { effectScope } from 'vue'

// The browser facts the Run screen and its top bar watch (composables/browser.ts).
describe('browser facts', () => {
  afterEach(() => { vi.useRealTimers() })

  it('follows the browser going offline and back online, one ref for the whole app', () => {
    const up = useNetworkUp()
    expect(useNetworkUp()).toBe(up)
    window.dispatchEvent(new Event('offline'))
    expect(up.value).toBe(false)
    window.dispatchEvent(new Event('online'))
    expect(up.value).toBe(true)
  })

  it('moves the clock on at its interval and stops when its scope ends', () => {
    vi.useFakeTimers({ now: new Date(2026, 11, 3, 14, 0, 0) })
    const scope = effectScope()
    const now = scope.run(() => useClock(15_000))!
    const start = now.value.getTime()
    vi.advanceTimersByTime(14_999)
    expect(now.value.getTime()).toBe(start)
    vi.advanceTimersByTime(1)
    expect(now.value.getTime()).toBe(start + 15_000)
    scope.stop()
    vi.advanceTimersByTime(60_000)
    expect(now.value.getTime()).toBe(start + 15_000)
  })
})
