import type { z } from 'zod'

export interface FieldIssue { path: string, message: string }

/** Turns a zod error into `{ path: 'cutter.diameter', message }` pairs for forms and API answers. */
export function toIssues(error: z.core.$ZodError): FieldIssue[] {
  return error.issues.map(issue => ({
    path: issue.path.map(String).join('.'),
    message: issue.message,
  }))
}

/** Issues keyed by path, for showing each message beside its field. */
export function issuesByPath(issues: FieldIssue[]): Record<string, string> {
  const out: Record<string, string> = {}
  for (const i of issues) out[i.path] ??= i.message
  return out
}
