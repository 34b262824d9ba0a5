import type { RunEvent } from '#shared/runs'
import type { ShopUser } from './authz'
import type { DB } from './db'

type Tx = Parameters<Parameters<DB['transaction']>[0]>[0]
type Override = Extract<RunEvent, { type: 'hold.overridden' }>

/**
 * Queues one alert per active owner for each hold override the sync merge has just stored.
 * Called inside the merge's transaction, so the alert exists exactly when the override does;
 * the dedupe key (event id and owner) makes a replayed or raced batch queue nothing twice.
 */
export async function enqueueOverrideAlerts(tx: Tx, user: ShopUser, events: RunEvent[]) {
  const overrides = events.filter((e): e is Override => e.type === 'hold.overridden')
  if (!overrides.length) return
  const owners = await activeOwners(tx, user.shopId)
  if (!owners.length) return
  const { runById, steps } = await alertContext(tx, user.shopId, overrides.map(o => o.runId))
  const site = siteUrl()
  for (const o of overrides) {
    const run = runById.get(o.runId)
    const step = steps.find(s => s.versionId === run?.versionId && s.key === o.stepKey)
    const signal = typeof step?.settings?.signalWord === 'string' ? `${step.settings.signalWord} ` : ''
    const hold = step ? `${signal}"${step.title}"` : `step ${o.stepKey}`
    const machine = run?.machine ?? 'a machine'
    const link = `${site}/runs/${o.runId}/record`
    const text = [
      `${user.name} (${user.role}) went past a hold point on ${machine}.`,
      `Hold: ${hold}\nProcedure: ${run?.procedure ?? 'unknown'}\nWhen: ${o.at.replace('T', ' ').slice(0, 19)} UTC (tablet time)\nReason written: "${o.reason}"`,
      `The run's record: ${link}`,
    ].join('\n\n')
    const html = `<p><strong>${escapeHtml(user.name)}</strong> (${escapeHtml(user.role)}) went past a hold point on <strong>${escapeHtml(machine)}</strong>.</p>`
      + `<p>Hold: ${escapeHtml(hold)}<br>Procedure: ${escapeHtml(run?.procedure ?? 'unknown')}<br>Reason written: &ldquo;${escapeHtml(o.reason)}&rdquo;</p>`
      + `<p><a href="${escapeHtml(link)}">Open the run's record</a></p>`
    for (const owner of owners) {
      await enqueueMail(tx, {
        shopId: user.shopId, kind: 'override', dedupeKey: `override:${o.id}:${owner.id}`, to: owner.email,
        subject: `Hold overridden on ${machine} by ${user.name}`, text, html,
      })
    }
  }
}

// The runs with their machine and procedure version (runs started in this batch are in too),
// and their steps' titles and signal words.
async function alertContext(tx: Tx, shopId: number, ids: string[]) {
  const runIds = [...new Set(ids)]
  const runs = await tx.select({
    id: tables.runs.id, versionId: tables.runs.procedureVersionId, machine: tables.machines.name, procedure: tables.procedureVersions.title,
  }).from(tables.runs)
    .innerJoin(tables.machines, eq(tables.machines.id, tables.runs.machineId))
    .innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.runs.procedureVersionId))
    .where(and(eq(tables.runs.shopId, shopId), inArray(tables.runs.id, runIds)))
  // The steps of those versions
  const steps = runs.length
    ? await tx.select({ versionId: tables.procedureSteps.versionId, key: tables.procedureSteps.key, title: tables.procedureSteps.title, settings: tables.procedureSteps.settings })
      .from(tables.procedureSteps).where(inArray(tables.procedureSteps.versionId, [...new Set(runs.map(r => r.versionId))]))
    : []
  return { runById: new Map(runs.map(r => [r.id, r])), steps }
}

type Signoff = Extract<RunEvent, { type: 'signoff.given' }>

/**
 * The same alert for a sign-off whose signature failed its check at merge (a wrong or locked
 * PIN sealed offline): the owner learns of it as of an override, in the same transaction.
 */
export async function enqueueSignoffFailedAlerts(tx: Tx, user: ShopUser, failed: { event: Signoff, reason: string, signerName: string }[]) {
  if (!failed.length) return
  const owners = await activeOwners(tx, user.shopId)
  if (!owners.length) return
  const { runById, steps } = await alertContext(tx, user.shopId, failed.map(f => f.event.runId))
  const site = siteUrl()
  for (const { event: e, reason, signerName } of failed) {
    const run = runById.get(e.runId)
    const step = e.stepKey ? steps.find(s => s.versionId === run?.versionId && s.key === e.stepKey) : undefined
    const what = e.stepKey ? (step ? `step "${step.title}"` : `step ${e.stepKey}`) : 'the whole run'
    const machine = run?.machine ?? 'a machine'
    const link = `${site}/runs/${e.runId}/record`
    const text = [
      `A sign-off in the name of ${signerName} on ${machine} failed its check; the run is flagged and the sign-off does not count.`,
      `Signed: ${what}\nProcedure: ${run?.procedure ?? 'unknown'}\nEntered by: ${user.name} (${user.role})\nWhen: ${e.at.replace('T', ' ').slice(0, 19)} UTC (tablet time)\nWhy: ${reason}`,
      `The run's record: ${link}`,
    ].join('\n\n')
    const html = `<p>A sign-off in the name of <strong>${escapeHtml(signerName)}</strong> on <strong>${escapeHtml(machine)}</strong> failed its check; the run is flagged and the sign-off does not count.</p>`
      + `<p>Signed: ${escapeHtml(what)}<br>Procedure: ${escapeHtml(run?.procedure ?? 'unknown')}<br>Entered by: ${escapeHtml(user.name)} (${escapeHtml(user.role)})<br>Why: ${escapeHtml(reason)}</p>`
      + `<p><a href="${escapeHtml(link)}">Open the run's record</a></p>`
    for (const owner of owners) {
      await enqueueMail(tx, {
        shopId: user.shopId, kind: 'signoff-failed', dedupeKey: `signoff-failed:${e.id}:${owner.id}`, to: owner.email,
        subject: `Sign-off failed its check on ${machine}`, text, html,
      })
    }
  }
}
