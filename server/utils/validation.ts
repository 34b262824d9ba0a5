import type { H3Event } from 'h3'
import type { z } from 'zod'
import { toIssues } from '#shared/schemas/issues'
import { checkedInput } from '#shared/schemas/input'

// Every bad input answers 400 with `data.issues: [{ path, message }]` naming the field and the
// reason; the first issue is repeated in `message` so a plain client still says something useful.
export function invalidIssues(issues: { path: string, message: string }[]) {
  const first = issues[0]
  return createError({
    statusCode: 400,
    statusMessage: 'Invalid input',
    message: first ? (first.path ? `${first.path}: ${first.message}` : first.message) : 'Invalid input',
    data: { issues },
  })
}

/** `skip`: top-level keys whose items the route checks one by one (see checkedInput). */
export async function readValid<S extends z.core.$ZodType>(event: H3Event, schema: S, skip: readonly string[] = []): Promise<z.output<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    throw invalidIssues([{ path: '', message: 'The request body is not valid JSON.' }])
  }
  if (body === undefined || body === null || body === '') throw invalidIssues([{ path: '', message: 'The request needs a JSON body.' }])
  const parsed = checkedInput(schema, skip).safeParse(body)
  if (!parsed.success) throw invalidIssues(toIssues(parsed.error))
  return parsed.data as z.output<S>
}

export function queryValid<S extends z.core.$ZodType>(event: H3Event, schema: S): z.output<S> {
  const parsed = checkedInput(schema).safeParse(getQuery(event))
  if (!parsed.success) throw invalidIssues(toIssues(parsed.error))
  return parsed.data as z.output<S>
}

export function paramsValid<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const parsed = schema.safeParse(getRouterParams(event, { decode: true }))
  if (!parsed.success) {
    throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No such record.' })
  }
  return parsed.data
}

export function notFound(what = 'record') {
  return createError({ statusCode: 404, statusMessage: 'Not found', message: `No such ${what}.` })
}

/** A 400 for one field: `path` names it as the schema would (steps.3.hazard), `message` says why. */
export function invalidInput(path: string, message: string) {
  return invalidIssues([{ path, message }])
}

/** A 409: the input is well formed but the record's state refuses it (retired, taken, accepted…). */
export function conflict(message: string, issues?: { path: string, message: string }[]) {
  return createError({ statusCode: 409, statusMessage: 'Conflict', message, ...(issues && { data: { issues } }) })
}
