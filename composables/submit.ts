import type { FieldIssue } from '#shared/schemas/issues'
import { issuesByPath } from '#shared/schemas/issues'

/**
 * The field issues of a failed request: the server's `data.issues` (each beside its field), else
 * its message, else `fallback` (no answer at all: the network or the server is out of reach).
 */
export function issuesOf(error: unknown, fallback: string): FieldIssue[] {
  const answer = (error as { data?: { message?: unknown, data?: { issues?: unknown } } } | null)?.data
  const issues = answer?.data?.issues
  if (Array.isArray(issues) && issues.length && issues.every(i => typeof i?.path === 'string' && typeof i?.message === 'string')) return issues
  return [{ path: '', message: typeof answer?.message === 'string' && answer.message ? answer.message : fallback }]
}

/** The first reason of a failed request, for forms with one message line. */
export const reasonOf = (error: unknown, fallback: string) => issuesOf(error, fallback)[0]!.message

/**
 * A form's submit: a busy flag (the button is disabled while the request runs) and the issues
 * by field path. `run` returns true when the request succeeded.
 */
export function useSubmit() {
  const busy = ref(false)
  const errors = ref<Record<string, string>>({})
  async function run(request: () => Promise<unknown>, fallback: string): Promise<boolean> {
    if (busy.value) return false
    busy.value = true
    errors.value = {}
    try {
      await request()
      return true
    }
    catch (e) {
      errors.value = issuesByPath(issuesOf(e, fallback))
      return false
    }
    finally {
      busy.value = false
    }
  }
  return { busy, errors, run }
}
