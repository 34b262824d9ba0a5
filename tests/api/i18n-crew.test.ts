import { parse } from 'csv-parse/sync'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, describe, expect, it } from 'vitest'
import { as, call, db, signIn } from './client'
import { deliveredMail, inviteLink } from './mail'

// The crew's languages (issue 16) in e-mail and export: an invite e-mailed in Spanish through
// the real SMTP path (the fake server catches it as a receiver would), the Ledger CSV asked for
// in Spanish read back with csv-parse (node-csv, independent of how the server builds rows),
// the daily digest in each owner's own language, and the crew routes' errors in Spanish.

const stamp = Date.now()
const BASE = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'

afterAll(async () => { await db().end() })

describe('the invite e-mail in the invitee\'s language', () => {
  it('goes out in Spanish when the owner chooses Spanish for it, link and all', async () => {
    const email = `invitacion-${stamp}@demo.jogwise.test`
    const res = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email, role: 'operator', language: 'es' } })
    expect(res.status, res.text).toBe(201)
    const { row, mail } = await deliveredMail(`invite:${res.body.id}`)
    expect(mail.subject).toMatch(/ te invita a .+ en Jogwise$/)
    expect(row.subject).toBe(mail.subject)
    expect(mail.text).toContain('como operario.')
    expect(mail.text).toContain('Abre este enlace para elegir tu nombre y tu contraseña:')
    expect(mail.text).toMatch(/El enlace sirve una sola vez y hasta el \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC\./)
    expect(mail.text).not.toMatch(/\b(invites you|Open this link|The link works)\b/)
    // The link itself is put in as the mail is sent, whatever the language; it opens the join
    // screen in Spanish, and the person who joins there starts with Spanish in their profile.
    const { token } = inviteLink(mail.text)
    expect(token).toHaveLength(43)
    expect(mail.text).toContain(`/join/${token}?lang=es`)
    const wrong = await call('POST', '/api/invites/accept', { body: { token, name: 'Rosa Prueba', password: 'operaria-prueba-1', language: 'xx' } })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.issues[0].path).toBe('language')
    const joined = await call('POST', '/api/invites/accept', { body: { token, name: 'Rosa Prueba', password: 'operaria-prueba-1', language: 'es' } })
    expect(joined.status, joined.text).toBe(201)
    const me = await call('GET', '/api/me', { cookie: await signIn(email, 'operaria-prueba-1') })
    expect(me.body.user.language).toBe('es')
  })

  it('stays English for an English-speaking owner who chooses nothing', async () => {
    const email = `invite-en-${stamp}@demo.jogwise.test`
    const res = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email, role: 'trainee' }, headers: { 'accept-language': 'en' } })
    expect(res.status, res.text).toBe(201)
    const { mail } = await deliveredMail(`invite:${res.body.id}`)
    expect(mail.subject).toMatch(/ invites you to .+ on Jogwise$/)
    expect(mail.text).toContain('as trainee.')
  })

  it('refuses a language Jogwise has no screens for, naming the field (in the caller\'s language)', async () => {
    const body = { email: `invite-xx-${stamp}@demo.jogwise.test`, role: 'operator', language: 'xx' }
    const en = await call('POST', '/api/invites', { cookie: await as('owner'), body, headers: { 'accept-language': 'en' } })
    expect(en.status).toBe(400)
    expect(en.body.data.issues).toEqual([{ path: 'language', message: 'Jogwise has no xx screens; choose one of en, es.' }])
    const es = await call('POST', '/api/invites', { cookie: await as('owner'), body, headers: { 'accept-language': 'es' } })
    expect(es.body.data.issues).toEqual([{ path: 'language', message: 'Jogwise no tiene pantallas en xx; elige uno de en, es.' }])
    const [[n]] = await db().query<any[]>('select count(*) as n from invites where email = ?', [body.email])
    expect(Number(n.n)).toBe(0)
  })
})

describe('the Ledger CSV in the caller\'s language', () => {
  let procedureId = 0
  it('has an acknowledged hold of its own to export', async () => {
    const proc = await call('POST', '/api/procedures', { cookie: await as('owner'), body: { procedure: {
      title: `CSV language procedure ${stamp}`, summary: 'A short procedure with a hold, for the CSV language check.', category: 'maintenance',
      steps: [
        { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock the isolator.', signalWord: 'WARNING', hazard: 'Unexpected start-up can injure hands near the cutter.', avoid: 'Lock the isolator off and prove nothing starts.' },
        { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
      ],
    } } })
    expect(proc.status, proc.text).toBe(201)
    procedureId = proc.body.id
    const operator = await as('operator')
    const me = await call('GET', '/api/me', { cookie: operator })
    const machineId = (await call('GET', '/api/machines', { cookie: operator })).body[0].id
    const runId = uuidv7()
    const ev = (type: string, extra: Record<string, unknown>) => ({ id: uuidv7(), runId, type, at: new Date().toISOString(), actorId: me.body.user.id, deviceId: 'csv-language-tablet', ...extra })
    const res = await call('POST', '/api/sync', { cookie: operator, body: { deviceId: 'csv-language-tablet', events: [
      ev('run.started', { procedureVersionId: proc.body.versionId, machineId, mode: 'guided' }),
      ev('hold.acknowledged', { stepKey: 'isolate', lang: 'es' }),
    ] } })
    expect(res.status, res.text).toBe(200)
    expect(res.body.rejected).toEqual([])
  })

  async function csv(language: string) {
    const res = await fetch(`${BASE}/api/ledger/export.csv?kind=hold-acknowledged&procedureId=${procedureId}`, { headers: { 'cookie': await as('owner'), 'accept-language': language } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    // csv-parse (node-csv): every record must have as many cells as the header row.
    const rows = parse(await res.text(), { bom: true, relax_column_count: false }) as string[][]
    return { header: rows[0]!, records: rows.slice(1) }
  }

  it('has Spanish headers and kind names, the same rows and the same codes as the English one', async () => {
    const [en, es] = [await csv('en'), await csv('es-MX,es;q=0.9')]
    expect(es.header).toHaveLength(en.header.length)
    expect(es.header).toEqual(expect.arrayContaining(['Cuándo (UTC)', 'Tipo', 'Persona', 'Máquina', 'Qué pasó', 'Idioma en pantalla', 'Tipo (código)', 'Detalle (JSON)']))
    expect(en.header).toEqual(expect.arrayContaining(['When (UTC)', 'Kind', 'Language on screen', 'Kind (code)']))
    expect(es.header.filter(h => en.header.includes(h) && !/^[A-Z()]+$/.test(h))).toEqual([])
    expect(es.records.length).toBe(1)
    expect(en.records.length).toBe(1)
    const col = (t: { header: string[] }, name: string) => t.header.indexOf(name)
    // Ids, codes and the JSON detail are for programs: the same in every language.
    for (const [i, row] of es.records.entries()) {
      const english = en.records[i]!
      expect(row[col(es, 'Entrada')]).toBe(english[col(en, 'Entry')])
      expect(row[col(es, 'Tipo (código)')]).toBe('hold-acknowledged')
      expect(row[col(es, 'Detalle (JSON)')]).toBe(english[col(en, 'Detail (JSON)')])
      expect(row[col(es, 'Tipo')]).toBe('Parada confirmada')
      expect(row[col(es, 'Cuenta')]).toBe('sí')
      expect(row[col(es, 'Idioma en pantalla')]).toBe('es')
      // The summary in Spanish, through the same templates as the Ledger screen.
      expect(row[col(es, 'Qué pasó')]).toBe('Confirmó la parada de ADVERTENCIA. Texto en pantalla: es.')
    }
  })
})

describe('the daily digest in each owner\'s language', () => {
  it('reaches a Spanish-speaking owner in Spanish and the others in English', async () => {
    const owner = await as('owner')
    const email = `duena-${stamp}@demo.jogwise.test`
    const made = await call('POST', '/api/users', { cookie: owner, body: { name: 'Marta Prueba', email, role: 'owner', password: 'duena-prueba-123' } })
    expect(made.status, made.text).toBe(201)
    try {
      const marta = await signIn(email, 'duena-prueba-123')
      expect((await call('PATCH', '/api/me', { cookie: marta, body: { language: 'es' } })).status).toBe(200)
      const res = await call('POST', '/api/mail/digest', { cookie: marta })
      expect(res.status, res.text).toBe(200)
      const { mail } = await deliveredMail(await digestKey(made.body.id, res.body.day))
      expect(mail.subject).toMatch(/^Resumen diario de Jogwise \d{4}-\d{2}-\d{2}: \d+ saltadas, \d+ fuera de rango, \d+ pendientes$/)
      expect(mail.text).toContain('Comprobaciones saltadas (')
      expect(mail.text).toContain('Lecturas fuera de rango (')
      expect(mail.text).toContain('Mantenimiento pendiente y atrasado (')
      expect(mail.text).not.toMatch(/\b(Skipped checks|Out-of-range readings|Daily digest)\b/)
      // Why each interval is due, in Spanish too (shared/rules/due-reason.ts)
      expect(mail.text).not.toMatch(/Never done|[Ll]ast done|[Nn]ot done yet|spindle hours used/)
      const due = Number(/Mantenimiento pendiente y atrasado \((\d+)\)/.exec(mail.text)?.[1])
      if (due > 0) expect(mail.text).toMatch(/Sin hacer nunca|[Hh]echo por última vez|[Ss]in hacer aún|horas de husillo usadas/)
      // The shop's other owners, who never chose a language, read the same day's digest in English.
      const [others] = await db().query<any[]>('select id from users where shop_id = (select shop_id from users where id = ?) and role = \'owner\' and active = 1 and language is null and id <> ?', [made.body.id, made.body.id])
      expect(others.length).toBeGreaterThan(0)
      for (const o of others) {
        const [[row]] = await db().query<any[]>('select subject from mail_outbox where dedupe_key = ?', [await digestKey(o.id, res.body.day)])
        expect(row.subject).toMatch(/^Jogwise daily digest /)
      }
    }
    finally {
      // Deactivated again, so other files count the demo shop's owners as before.
      expect((await call('PATCH', `/api/users/${made.body.id}`, { cookie: owner, body: { active: false } })).status).toBe(200)
    }
  })
})

async function digestKey(userId: number, day: string) {
  const [[u]] = await db().query<any[]>('select shop_id from users where id = ?', [userId])
  return `digest:${u.shop_id}:${day}:${userId}`
}

describe('crew and paper-run errors in Spanish', () => {
  it('adding a person with bad fields: paths kept, messages in Spanish', async () => {
    const res = await call('POST', '/api/users', { cookie: await as('owner'), headers: { 'accept-language': 'es' }, body: { name: '', email: 'x', role: 'boss', password: 'short' } })
    expect(res.status).toBe(400)
    expect(Object.fromEntries(res.body.data.issues.map((i: any) => [i.path, i.message]))).toEqual({
      name: 'Escribe un nombre.',
      email: 'Escribe un correo válido.',
      role: 'Rol: tiene que ser uno de estos: owner, trainer, operator, trainee.',
      password: 'Usa al menos 10 caracteres para la contraseña.',
    })
  })

  it('a paper run with nothing chosen', async () => {
    const res = await call('POST', '/api/paper-runs', { cookie: await as('owner'), headers: { 'accept-language': 'es' }, body: {} })
    expect(res.status).toBe(400)
    const messages = Object.fromEntries(res.body.data.issues.map((i: any) => [i.path, i.message]))
    expect(messages.machineId).toBe('Máquina: hay que elegirlo.')
    expect(messages.mode).toBe('El modo tiene que ser guiado o solo.')
  })

  it('an invite link that matches nothing', async () => {
    const res = await call('GET', `/api/invites/preview?token=${'a'.repeat(43)}`, { headers: { 'accept-language': 'es' } })
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Ninguna invitación corresponde a este enlace. Comprueba que se abrió el enlace entero.')
  })
})
