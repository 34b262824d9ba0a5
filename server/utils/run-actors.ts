import type { RunEvent } from '#shared/runs'
import { LEAD_ROLES, runModeFor, type Role } from '#shared/types/roles'

// Who may add to a run (issue 18, "who may act on a run"): the person who started it, the
// people it was handed over to, and the leads (trainers and the owner). Each person's own
// qualification decides what they may do in a solo run: someone who would run this procedure
// guided (a trainee, an operator not qualified for it) may not act inside a solo run. Such an
// event is stored with a refusing verdict, so the record shows it and the fold does not count it.

export interface RunCrew { startedBy: number, mode: 'guided' | 'solo', procedureId: number, handedTo: Set<number> }
export interface Actor { id: number, role: Role, name: string }

/** The crews of these runs: their starter, mode, procedure and the hand-overs stored so far. */
export async function loadRunCrews(db: DB, shopId: number, runs: { id: string, startedBy: number, mode: 'guided' | 'solo', procedureId: number }[]) {
  const crews = new Map<string, RunCrew>(runs.map(r => [r.id, { startedBy: r.startedBy, mode: r.mode, procedureId: r.procedureId, handedTo: new Set<number>() }]))
  if (!runs.length) return crews
  // The hand-overs of these runs that counted
  const rows = await db.select({ runId: tables.runEvents.runId, payload: tables.runEvents.payload }).from(tables.runEvents)
    .where(and(eq(tables.runEvents.shopId, shopId), inArray(tables.runEvents.runId, runs.map(r => r.id)), eq(tables.runEvents.type, 'run.handed-over'), isNull(tables.runEvents.flag)))
  for (const row of rows) {
    const to = Number(row.payload.toUserId)
    if (Number.isInteger(to)) crews.get(row.runId)?.handedTo.add(to)
  }
  return crews
}

/** Why this person may not add this event to this run, or null when they may. */
export function actorProblem(crew: RunCrew, actor: Actor, qualifiedFor: Set<number>, event: RunEvent): string | null {
  if (event.type === 'run.started') return null
  if (LEAD_ROLES.includes(actor.role)) return null
  if (actor.id !== crew.startedBy && !crew.handedTo.has(actor.id)) {
    return `${actor.name} is not on this run: only the person who started it, people it was handed over to, and trainers or the owner may add to it.`
  }
  if (crew.mode === 'solo' && runModeFor(actor.role, qualifiedFor.has(crew.procedureId)) !== 'solo') {
    return actor.role === 'trainee'
      ? `${actor.name} is a trainee and may not act in a solo run; a trainee's work is guided.`
      : `${actor.name} is not qualified to run this procedure unsupervised, so may not act in a solo run.`
  }
  return null
}
