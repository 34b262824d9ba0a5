import { describe, expect, it } from 'vitest'
import { nextDelay } from '../../utils/backoff'

// Exponential backoff with "full jitter" as described in the AWS Architecture Blog post
// "Exponential Backoff And Jitter" (M. Brooker, 2015) — cited from memory; here the lower half
// of each window is kept so a retry is never immediate.
describe('nextDelay', () => {
  it.each([
    [1, 500, 1000],
    [2, 1000, 2000],
    [3, 2000, 4000],
    [6, 16_000, 32_000],
    [7, 30_000, 60_000],
    [20, 30_000, 60_000],
  ])('after %i failures waits between %i and %i ms', (failures, low, high) => {
    expect(nextDelay(failures, () => 0)).toBe(low)
    expect(nextDelay(failures, () => 1)).toBe(high)
    for (let i = 0; i < 50; i++) {
      const d = nextDelay(failures)
      expect(d).toBeGreaterThanOrEqual(low)
      expect(d).toBeLessThanOrEqual(high)
    }
  })

  it('spreads tablets that failed together over the window', () => {
    const delays = new Set(Array.from({ length: 100 }, () => nextDelay(5)))
    expect(delays.size).toBeGreaterThan(50)
  })
})
