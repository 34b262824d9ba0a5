/**
 * Delay before the next sync attempt after `failures` failures in a row: exponential from one
 * second, capped at a minute, with "full jitter" so a room of tablets that lost the Wi-Fi
 * together do not all come back at the same instant.
 */
export function nextDelay(failures: number, random: () => number = Math.random): number {
  const ceiling = Math.min(60_000, 1000 * 2 ** Math.max(0, failures - 1))
  return Math.round(ceiling / 2 + random() * ceiling / 2)
}
