import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop, signIn } from './client'
import { deliveredMail } from './mail'

// Mail the owner gets without asking: an alert for every hold override (written in the same
// transaction as the override) and the daily digest of skipped checks, out-of-range readings
// and due maintenance. Both are read back from the fake SMTP server as a receiver sees them.

interface Ctx { shopId: number, trainer: { id: number, name: string }, operatorId: number, machine: { id: number, name: string }, procedure: any, hold: any, check: any }
let ctx: Ctx

async function me(cookie: string) { return (await call('GET', '/api/me', { cookie })).body.user }
async function activeOwners(shopId: number) {
  const [rows] = await db().query<any[]>('select id, email from users where shop_id = ? and role = ? and active = 1', [shopId, 'owner'])
  return rows as { id: number, email: string }[]
}

beforeAll(async () => {
  const trainer = await me(await as('trainer'))
  const operator = await me(await as('operator'))
  const machine = (await call('GET', '/api/machines', { cookie: await as('trainer') })).body[0]
  const procedures = (await call('GET', '/api/procedures', { cookie: await as('trainer') })).body
  const procedure = procedures.find((p: any) => p.current.steps.some((s: any) => s.kind === 'hold') && p.current.steps.some((s: any) => s.kind === 'check'))
  ctx = {
    shopId: trainer.shopId, trainer, operatorId: operator.id, machine, procedure,
    hold: procedure.current.steps.find((s: any) => s.kind === 'hold'), check: procedure.current.steps.find((s: any) => s.kind === 'check'),
  }
})
afterAll(async () => { await db().end() })

describe('override alerts', () => {
  let runId: string
  let overrideId: string
  const reason = 'Guard bracket is away for repair; spindle isolated and tagged out meanwhile'

  it('mails every active owner who, which machine, which hold, the reason and the run link', async () => {
    // A deactivated owner gets nothing.
    const extra = await call('POST', '/api/users', { cookie: await as('owner'), body: { name: 'Former Owner', email: `former-owner-${Date.now()}@demo.jogwise.test`, role: 'owner', password: 'former-owner-pass' } })
    await call('PATCH', `/api/users/${extra.body.id}`, { cookie: await as('owner'), body: { active: false } })

    runId = uuidv7()
    overrideId = uuidv7()
    const base = { runId, actorId: ctx.trainer.id, deviceId: 'alert-tablet' }
    const t0 = Date.now() - 5000
    const batch = { deviceId: 'alert-tablet', events: [
      { ...base, id: uuidv7(), type: 'run.started', at: new Date(t0).toISOString(), procedureVersionId: ctx.procedure.current.id, machineId: ctx.machine.id, mode: 'solo' },
      { ...base, id: overrideId, type: 'hold.overridden', at: new Date(t0 + 1000).toISOString(), stepKey: ctx.hold.key, reason },
    ] }
    const res = await call('POST', '/api/sync', { cookie: await as('trainer'), body: batch })
    expect(res.body.accepted).toHaveLength(2)

    const owners = await activeOwners(ctx.shopId)
    expect(owners.length).toBeGreaterThan(0)
    for (const owner of owners) {
      const { mail } = await deliveredMail(`override:${overrideId}:${owner.id}`)
      expect(mail.to.map(t => t.address)).toEqual([owner.email])
      expect(mail.subject).toContain(ctx.machine.name)
      expect(mail.subject).toContain(ctx.trainer.name)
      expect(mail.text).toContain(ctx.trainer.name)
      expect(mail.text).toContain(ctx.hold.title)
      expect(mail.text).toContain(ctx.hold.signalWord)
      expect(mail.text).toContain(reason)
      expect(mail.text).toMatch(new RegExp(`https?://\\S+/runs/${runId}/record`))
    }
    const [[former]] = await db().query<any[]>('select count(*) as n from mail_outbox where dedupe_key = ?', [`override:${overrideId}:${extra.body.id}`])
    expect(Number(former.n)).toBe(0)

    // The same batch again (a tablet's replay) queues nothing more.
    const again = await call('POST', '/api/sync', { cookie: await as('trainer'), body: batch })
    expect(again.body.accepted).toHaveLength(2)
    const [[n]] = await db().query<any[]>('select count(*) as n from mail_outbox where dedupe_key like ?', [`override:${overrideId}:%`])
    expect(Number(n.n)).toBe(owners.length)
  })

  it('sends nothing for an override the merge refuses', async () => {
    const id = uuidv7()
    const res = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'alert-tablet', events: [
      { id, runId, actorId: ctx.operatorId, deviceId: 'alert-tablet', type: 'hold.overridden', at: new Date().toISOString(), stepKey: ctx.hold.key, reason },
    ] } })
    expect(res.body.rejected.map((r: any) => r.id)).toEqual([id])
    const [[n]] = await db().query<any[]>('select count(*) as n from mail_outbox where dedupe_key like ?', [`override:${id}:%`])
    expect(Number(n.n)).toBe(0)
  })

  it('names the procedure and the hold in the owner\'s language where the version is translated', async () => {
    const owner = await as('owner')
    const email = `duena-${Date.now()}@demo.jogwise.test`
    const made = await call('POST', '/api/users', { cookie: owner, body: { name: 'Dueña Prueba', email, role: 'owner', password: 'duena-prueba-1' } })
    expect(made.status, made.text).toBe(201)
    const her = await signIn(email, 'duena-prueba-1')
    expect((await call('PATCH', '/api/me', { cookie: her, body: { language: 'es' } })).status).toBe(200)
    // The demo shop's starter procedures come with Spanish (shared/procedures/starter/es).
    const procedures = (await call('GET', '/api/procedures', { cookie: owner })).body
    const procedure = procedures.find((p: any) => p.slug === 'spoilboard-resurfacing' || p.current.title === 'Resurface the spoilboard')
    const version = (await call('GET', `/api/procedure-versions/${procedure.current.id}`, { cookie: owner })).body
    const es = version.translations.es
    const hold = version.steps.find((s: any) => s.kind === 'hold' && es.steps[s.key]?.title)
    const id = uuidv7()
    const run = uuidv7()
    const base = { runId: run, actorId: ctx.trainer.id, deviceId: 'alert-tablet' }
    const res = await call('POST', '/api/sync', { cookie: await as('trainer'), body: { deviceId: 'alert-tablet', events: [
      { ...base, id: uuidv7(), type: 'run.started', at: new Date(Date.now() - 5000).toISOString(), procedureVersionId: procedure.current.id, machineId: ctx.machine.id, mode: 'solo' },
      { ...base, id, type: 'hold.overridden', at: new Date(Date.now() - 4000).toISOString(), stepKey: hold.key, reason: 'Guard bracket is away for repair; spindle isolated and tagged out meanwhile' },
    ] } })
    expect(res.body.accepted).toHaveLength(2)
    try {
      const { mail } = await deliveredMail(`override:${id}:${made.body.id}`)
      expect(mail.text).toContain(`"${es.steps[hold.key].title}"`)
      expect(mail.text).toContain(es.title)
      expect(mail.text).not.toContain(hold.title)
      // An English-speaking owner still reads the original titles.
      const english = (await activeOwners(ctx.shopId)).find(o => o.id !== made.body.id)!
      expect((await deliveredMail(`override:${id}:${english.id}`)).mail.text).toContain(`"${hold.title}"`)
    }
    finally {
      // Only this test's owner: the digest below counts the shop's owners.
      await call('PATCH', `/api/users/${made.body.id}`, { cookie: owner, body: { active: false } })
    }
  })
})

describe('the daily digest', () => {
  it('lists the last day\'s skipped checks and out-of-range readings and what is due, once per day', async () => {
    const hour = 3600_000
    const runId = uuidv7()
    const started = await call('POST', '/api/sync', { cookie: await as('operator'), body: { deviceId: 'digest-tablet', events: [
      { id: uuidv7(), runId, actorId: ctx.operatorId, deviceId: 'digest-tablet', type: 'run.started', at: new Date(Date.now() - 3 * hour).toISOString(), procedureVersionId: ctx.procedure.current.id, machineId: ctx.machine.id, mode: 'guided' },
    ] } })
    expect(started.body.accepted).toHaveLength(1)
    const entry = (kind: string, agoHours: number, detail: Record<string, unknown>, shop = { shopId: ctx.shopId, runId, machineId: ctx.machine.id, procedureId: ctx.procedure.id }) =>
      db().query('insert into ledger_entries (shop_id, event_id, run_id, kind, actor_id, machine_id, procedure_id, step_key, at, detail) values (?,?,?,?,?,?,?,?,?,?)', [
        shop.shopId, uuidv7(), shop.runId, kind, ctx.operatorId, shop.machineId, shop.procedureId, ctx.check.key, new Date(Date.now() - agoHours * hour), JSON.stringify(detail),
      ])
    // Details in the shape the sync merge writes them (shared/runs/ledger.ts).
    await entry('skipped-check', 2, { stepTitle: ctx.check.title, reason: 'Gauge was out on loan to the bench router' })
    await entry('out-of-range', 1, { stepTitle: ctx.check.title, value: 17.2, unit: 'mm', side: 'below', range: '17.5 to 19 mm', reason: 'Board thinner near the front edge' })
    await entry('skipped-check', 30, { reason: 'yesterday-morning-marker' })
    await entry('override', 1, { reason: 'override-entry-marker' })
    const other = await otherShop()
    const [[otherOwner]] = await db().query<any[]>('select id from users where shop_id = ? limit 1', [other.shopId])
    await db().query('insert into ledger_entries (shop_id, event_id, run_id, kind, actor_id, machine_id, procedure_id, step_key, at, detail) values (?,?,?,?,?,?,?,?,?,?)', [
      other.shopId, uuidv7(), other.runId, 'skipped-check', otherOwner.id, other.machineId, other.procedureId, 'x', new Date(Date.now() - hour), JSON.stringify({ reason: 'other-shop-marker' }),
    ])
    // Maintenance every 7 days of a procedure never run to its end on this machine, in the shop
    // for 30 days (intervals count from when the machine was added): overdue.
    await db().query('update machines set created_at = ? where id = ?', [new Date(Date.now() - 30 * 24 * hour), ctx.machine.id])
    const [due] = await db().query<any>('insert into maintenance_intervals (shop_id, procedure_id, machine_id, every_days) values (?, ?, ?, 7)', [ctx.shopId, ctx.procedure.id, ctx.machine.id])

    // Today's digest may already have gone out (the worker or the route matrix); start afresh.
    await db().query('delete from mail_outbox where dedupe_key like ?', [`digest:${ctx.shopId}:%`])
    const res = await call('POST', '/api/mail/digest', { cookie: await as('owner') })
    expect(res.status).toBe(200)
    const owners = await activeOwners(ctx.shopId)
    expect(res.body).toMatchObject({ queued: owners.length, owners: owners.length })

    const [[operator]] = await db().query<any[]>('select name from users where id = ?', [ctx.operatorId])
    // The numbers each section should show, counted straight from the table
    // (entries a later event changed are left out: their newer revision, if any, counts)
    const [counts] = await db().query<any[]>('select kind, count(*) as n from ledger_entries where shop_id = ? and changed_at is null and at >= now(3) - interval 24 hour and at <= now(3) group by kind', [ctx.shopId])
    const count = (kind: string) => Number(counts.find((c: any) => c.kind === kind)?.n ?? 0)

    for (const owner of owners) {
      const { mail } = await deliveredMail(`digest:${ctx.shopId}:${res.body.day}:${owner.id}`)
      const text = mail.text
      const skipped = text.slice(text.indexOf('Skipped checks'), text.indexOf('Out-of-range readings'))
      const outOfRange = text.slice(text.indexOf('Out-of-range readings'), text.indexOf('Maintenance due'))
      const maintenance = text.slice(text.indexOf('Maintenance due'))
      expect(skipped).toContain(`Skipped checks (${count('skipped-check')})`)
      expect(outOfRange).toContain(`Out-of-range readings (${count('out-of-range')})`)
      expect(skipped).toMatch(new RegExp(`${ctx.machine.name} · ${ctx.procedure.current.title} · "${ctx.check.title}" · ${operator.name} · reason: "Gauge was out on loan to the bench router"`))
      expect(outOfRange).toContain('reading 17.2 mm, allowed 17.5 to 19 mm, reason: "Board thinner near the front edge"')
      expect(outOfRange).toContain(`/runs/${runId}/record`)
      expect(maintenance).toMatch(/(DUE|OVERDUE) · /)
      expect(maintenance).toContain(`OVERDUE · ${ctx.machine.name} · ${ctx.procedure.current.title}`)
      for (const absent of ['yesterday-morning-marker', 'override-entry-marker', 'other-shop-marker']) expect(text).not.toContain(absent)
    }
    // Once per owner and day.
    const again = await call('POST', '/api/mail/digest', { cookie: await as('owner') })
    expect(again.body.queued).toBe(0)
    await db().query('delete from maintenance_intervals where id = ?', [due.insertId])
  })
})
