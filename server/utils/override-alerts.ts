import type { RunEvent } from '#shared/runs'
import { storedTitlesIn } from '#shared/procedures'
import type { ShopUser } from './authz'
import type { Tx } from './db'

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
    const word = typeof step?.settings?.signalWord === 'string' ? step.settings.signalWord : null
    const link = `${site}/runs/${o.runId}/record`
    // Each owner reads the alert in their own language (server/utils/language.ts).
    for (const owner of owners) {
      const lang = owner.language ?? 'en'
      const m = (key: string, values: Record<string, string | number> = {}) => messageIn(lang, `mail.${key}`, values)
      const signal = word ? `${m(`signal.${word}`)} ` : ''
      const titles = titlesIn(lang, run, step)
      const hold = titles.step ? `${signal}"${titles.step}"` : m('step', { key: o.stepKey })
      const machine = run?.machine ?? m('aMachine')
      const procedure = titles.procedure ?? m('unknown')
      const role = m(`role.${user.role}`)
      const text = [
        m('override.intro', { name: user.name, role, machine }),
        `${m('hold')}: ${hold}\n${m('procedure')}: ${procedure}\n${m('when')}: ${o.at.replace('T', ' ').slice(0, 19)} ${m('tabletTime')}\n${m('reasonWritten')}: "${o.reason}"`,
        `${m('record')}: ${link}`,
      ].join('\n\n')
      const html = `<p>${m('override.introHtml', { name: `<strong>${escapeHtml(user.name)}</strong>`, role: escapeHtml(role), machine: `<strong>${escapeHtml(machine)}</strong>` })}</p>`
        + `<p>${m('hold')}: ${escapeHtml(hold)}<br>${m('procedure')}: ${escapeHtml(procedure)}<br>${m('reasonWritten')}: &ldquo;${escapeHtml(o.reason)}&rdquo;</p>`
        + `<p><a href="${escapeHtml(link)}">${m('openRecord')}</a></p>`
      await enqueueMail(tx, {
        shopId: user.shopId, kind: 'override', dedupeKey: `override:${o.id}:${owner.id}`, to: owner.email,
        subject: m('override.subject', { machine, name: user.name }), text, html,
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
    translations: tables.procedureVersions.translations,
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

type AlertRun = { procedure: string, translations: Record<string, unknown> | null }

// The procedure's and the step's titles in the owner's language where the version has them.
function titlesIn(lang: string, run: AlertRun | undefined, step: { key: string, title: string } | undefined) {
  const titles = storedTitlesIn(run?.translations, lang)
  return { procedure: (run && titles.procedure(run.procedure)) || undefined, step: step && titles.step(step.key, step.title) }
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
    const link = `${site}/runs/${e.runId}/record`
    for (const owner of owners) {
      const lang = owner.language ?? 'en'
      const m = (key: string, values: Record<string, string | number> = {}) => messageIn(lang, `mail.${key}`, values)
      const titles = titlesIn(lang, run, step)
      const what = e.stepKey ? (titles.step ? m('stepTitled', { title: titles.step }) : m('step', { key: e.stepKey })) : m('wholeRun')
      const machine = run?.machine ?? m('aMachine')
      const procedure = titles.procedure ?? m('unknown')
      const role = m(`role.${user.role}`)
      const text = [
        m('signoffFailed.intro', { name: signerName, machine }),
        `${m('signed')}: ${what}\n${m('procedure')}: ${procedure}\n${m('enteredBy')}: ${user.name} (${role})\n${m('when')}: ${e.at.replace('T', ' ').slice(0, 19)} ${m('tabletTime')}\n${m('why')}: ${reason}`,
        `${m('record')}: ${link}`,
      ].join('\n\n')
      const html = `<p>${m('signoffFailed.intro', { name: `<strong>${escapeHtml(signerName)}</strong>`, machine: `<strong>${escapeHtml(machine)}</strong>` })}</p>`
        + `<p>${m('signed')}: ${escapeHtml(what)}<br>${m('procedure')}: ${escapeHtml(procedure)}<br>${m('enteredBy')}: ${escapeHtml(user.name)} (${escapeHtml(role)})<br>${m('why')}: ${escapeHtml(reason)}</p>`
        + `<p><a href="${escapeHtml(link)}">${m('openRecord')}</a></p>`
      await enqueueMail(tx, {
        shopId: user.shopId, kind: 'signoff-failed', dedupeKey: `signoff-failed:${e.id}:${owner.id}`, to: owner.email,
        subject: m('signoffFailed.subject', { machine }), text, html,
      })
    }
  }
}
