// Result shape of the machining entry points: the value under its own key, or field issues
// in the same `{ path, message }` form the rest of Jogwise uses.
import type { FieldIssue } from '../schemas/issues'

export { toIssues, type FieldIssue } from '../schemas/issues'

export type Checked<K extends string, T> =
  | ({ ok: true } & { [P in K]: T })
  | { ok: false, issues: FieldIssue[] }
