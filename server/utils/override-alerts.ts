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
  const runIds = [...new Set(overrides.map(o => o.runId))]
  // The runs with their machine and procedure version (runs started in this batch are in too)
  const runs = await tx.select({
    id: tables.runs.id, versionId: tables.runs.procedureVersionId, machine: tables.machines.name, procedure: tables.procedureVersions.title,
  }).from(tables.runs)
    .innerJoin(tables.machines, eq(tables.machines.id, tables.runs.machineId))
    .innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.runs.procedureVersionId))
    .where(and(eq(tables.runs.shopId, user.shopId), inArray(tables.runs.id, runIds)))
  const runById = new Map(runs.map(r => [r.id, r]))
  // The hold steps' titles and signal words
  const steps = runs.length
    ? await tx.select({ versionId: tables.procedureSteps.versionId, key: tables.procedureSteps.key, title: tables.procedureSteps.title, settings: tables.procedureSteps.settings })
      .from(tables.procedureSteps).where(inArray(tables.procedureSteps.versionId, [...new Set(runs.map(r => r.versionId))]))
    : []
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
