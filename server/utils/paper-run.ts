import { paperRunEvents, PAPER_DEVICE_ID } from '#shared/paper/paper-run-events'
import type { PaperRun } from '#shared/schemas/paper-run'
import type { FieldIssue } from '#shared/schemas/issues'
import { runModeFor } from '#shared/types/roles'
import type { RunEvent } from '#shared/runs'
import type { ShopUser } from './authz'

// A run done on a printed sheet, entered afterwards by a trainer or the owner. It is stored as
// the ordinary run events the sheet stands for (shared/paper/paper-run-events.ts) and folded by
// refoldRuns like a synced run, so the record, the Ledger, the CSV and the due list read it as
// any run; runs.origin = 'paper' with who entered it and when marks it everywhere, and one
// entered-from-paper Ledger entry says so.

const invalid = (issues: FieldIssue[]) => invalidIssues(issues)

/** Checks the sheet against the shop's rows; the people, machine and version it names. */
async function lookUp(user: ShopUser, input: PaperRun) {
  const db = useDB()
  const issues: FieldIssue[] = []
  // The machine, the version and the people named, in this shop
  const [machine] = await db.select({ id: tables.machines.id, name: tables.machines.name, createdAt: tables.machines.createdAt, retiredAt: tables.machines.retiredAt })
    .from(tables.machines).where(and(eq(tables.machines.id, input.machineId), eq(tables.machines.shopId, user.shopId))).limit(1)
  const version = (await loadVersions(user.shopId, [input.procedureVersionId])).get(input.procedureVersionId)
  const people = await db.select({ id: tables.users.id, name: tables.users.name, role: tables.users.role, active: tables.users.active })
    .from(tables.users).where(and(eq(tables.users.shopId, user.shopId), inArray(tables.users.id, [input.operatorId, input.signerId ?? input.operatorId])))
  const operator = people.find(p => p.id === input.operatorId)
  const signer = input.signerId === undefined ? null : people.find(p => p.id === input.signerId) ?? null
  const start = Date.parse(input.startedAt)
  if (!machine) issues.push({ path: 'machineId', message: 'No such machine in this shop.' })
  else if (start < machine.createdAt.getTime()) issues.push({ path: 'startedAt', message: `Started at is before ${machine.name} was added to Jogwise (${machine.createdAt.toISOString().slice(0, 10)}).` })
  else if (machine.retiredAt && start > machine.retiredAt.getTime()) issues.push({ path: 'startedAt', message: `${machine.name} was retired before that date.` })
  if (!version) issues.push({ path: 'procedureVersionId', message: 'No such procedure version in this shop.' })
  else if (start < version.createdAt.getTime()) issues.push({ path: 'startedAt', message: `Version ${version.version} was published on ${version.createdAt.toISOString().slice(0, 10)}; a run cannot follow it before that.` })
  if (!operator) issues.push({ path: 'operatorId', message: 'No such person in this shop.' })
  if (input.signerId !== undefined && (!signer || !signer.active || (signer.role !== 'trainer' && signer.role !== 'owner'))) {
    issues.push({ path: 'signerId', message: 'The person who signed must be an active trainer or owner of this shop.' })
  }
  if (operator && version && input.mode === 'solo') {
    // Was the person qualified to run this procedure unsupervised?
    const [q] = await db.select({ id: tables.qualifications.id }).from(tables.qualifications)
      .where(and(eq(tables.qualifications.userId, operator.id), eq(tables.qualifications.procedureId, version.procedureId))).limit(1)
    if (runModeFor(operator.role, !!q) !== 'solo') issues.push({ path: 'mode', message: `${operator.name} is not qualified to run this procedure unsupervised; enter it as guided.` })
  }
  if (issues.length) throw invalid(issues)
  return { machine: machine!, version: version!, operator: operator!, signer: signer as { id: number, name: string, role: 'trainer' | 'owner' } | null }
}

const eventRow = (shopId: number, e: RunEvent) => {
  const { id, runId, type, actorId, deviceId, at, ...payload } = e
  return { id, shopId, runId, type, actorId, deviceId, at: new Date(at), payload: payload as Record<string, unknown> }
}

/** Stores a paper run; a second call with the same run id answers the first one's run. */
export async function enterPaperRun(user: ShopUser, input: PaperRun): Promise<{ runId: string, created: boolean }> {
  const db = useDB()
  // A run with this id already (the form sent twice)?
  const [existing] = await db.select({ shopId: tables.runs.shopId, origin: tables.runs.origin }).from(tables.runs).where(eq(tables.runs.id, input.runId)).limit(1)
  if (existing) {
    if (existing.shopId === user.shopId && existing.origin === 'paper') return { runId: input.runId, created: false }
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'That run id is already used; reload the form.' })
  }
  const { machine, version, operator, signer } = await lookUp(user, input)
  const built = paperRunEvents(input, version.steps, signer)
  if (!built.ok) throw invalid(built.issues)
  const enteredAt = new Date()
  try {
    await storePaperRun(user, input, { machine, version, operator, signer, events: built.events, enteredAt })
  }
  catch (error) {
    // The same sheet sent twice at once: the other request stored it.
    if (!duplicateKey(error)) throw error
    const [row] = await db.select({ shopId: tables.runs.shopId, origin: tables.runs.origin }).from(tables.runs).where(eq(tables.runs.id, input.runId)).limit(1)
    if (row?.shopId === user.shopId && row.origin === 'paper') return { runId: input.runId, created: false }
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'That run id is already used; reload the form.' })
  }
  return { runId: input.runId, created: true }
}

type Found = Awaited<ReturnType<typeof lookUp>>

async function storePaperRun(user: ShopUser, input: PaperRun, p: Found & { events: RunEvent[], enteredAt: Date }) {
  const { machine, version, operator, signer, events, enteredAt } = p
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    const t = tx as unknown as DB
    await t.insert(tables.runs).values({
      id: input.runId, shopId: user.shopId, machineId: machine.id, procedureVersionId: version.id, startedBy: operator.id,
      mode: input.mode, startedAt: new Date(input.startedAt), origin: 'paper', enteredBy: user.id, enteredAt,
    })
    // The sheet's events, as a tablet would have sent them
    await t.insert(tables.runEvents).values(events.map(e => eventRow(user.shopId, e)))
    await refoldRuns(t, user.shopId, [input.runId], events.map(e => e.id))
    await t.insert(tables.ledgerEntries).values({
      shopId: user.shopId, eventId: events[0]!.id, runId: input.runId, kind: 'entered-from-paper', actorId: user.id,
      machineId: machine.id, procedureId: version.procedureId, stepKey: null, at: enteredAt, receivedAt: enteredAt,
      entryKey: `paper:${input.runId}`,
      detail: {
        operatorId: operator.id, operatorName: operator.name, signerId: signer?.id ?? null, signerName: signer?.name ?? null,
        enteredBy: user.id, enteredByName: user.name, enteredAt: enteredAt.toISOString(),
        ranAt: new Date(input.startedAt).toISOString(), finishedAt: new Date(input.finishedAt).toISOString(),
        version: version.version, outcome: input.outcome, deviceId: PAPER_DEVICE_ID,
      },
    })
    await recordAudit(tx, user, 'run.entered-from-paper', 'run', input.runId, { operatorId: operator.id, machineId: machine.id, procedureVersionId: version.id })
  }))
}

/** Files the photo of the sheet with its paper run (an upload made for that run). */
export async function attachPaperSheet(user: ShopUser, run: { id: string, origin: string }, uploadId: string) {
  const db = useDB()
  const runId = run.id
  if (run.origin !== 'paper') throw invalid([{ path: '', message: 'Only a run entered from paper has a photo of its sheet.' }])
  // The upload, made for this run in this shop
  const [upload] = await db.select({ id: tables.uploads.id }).from(tables.uploads)
    .where(and(eq(tables.uploads.id, uploadId), eq(tables.uploads.shopId, user.shopId), eq(tables.uploads.runId, runId))).limit(1)
  if (!upload) throw invalid([{ path: 'uploadId', message: 'No photo with this id was uploaded for this run.' }])
  await withWriteRetry(() => db.transaction(async (tx) => {
    await tx.update(tables.runs).set({ sheetUploadId: uploadId }).where(eq(tables.runs.id, runId))
    await recordAudit(tx, user, 'run.sheet-attached', 'run', runId, { uploadId })
  }))
  return { runId, sheetUploadId: uploadId }
}
