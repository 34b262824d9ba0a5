/**
 * Key-sorted JSON: two copies of the same value compare equal whatever their key order (a copy
 * read back from the database, a replay from another tablet). Undefined members are left out,
 * as JSON.stringify leaves them out.
 */
export function keySortedJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(keySortedJson).join(',')}]`
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${keySortedJson(v)}`).join(',')}}`
  }
  return JSON.stringify(value) ?? 'null'
}
