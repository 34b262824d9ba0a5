import { parse } from 'csv-parse/sync'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, signIn } from './client'
import { seal } from './seal'

// The crew's languages (issue 16) against the real server and MariaDB: errors in the caller's
// language (profile, then the tablet's cookie, then Accept-Language), field issues keeping their
// paths, a person choosing a language, a Spanish-speaking trainee acknowledging a hold with the
// language recorded on the event, the Ledger and its CSV, and procedure translations per version.

const PROCEDURE = {
  title: `Language check procedure ${Date.now()}`,
  summary: 'A short procedure with a hold, used by the language checks.',
  category: 'maintenance',
  steps: [
    { key: 'isolate', kind: 'hold', title: 'Isolate the power', body: 'Switch off and lock the isolator.', signalWord: 'WARNING', hazard: 'Unexpected start-up can injure hands near the cutter.', avoid: 'Lock the isolator off and prove nothing starts.' },
    { key: 'work', kind: 'instruction', title: 'Do the work', body: 'Do the work with the power off.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' },
  ],
}
const SPANISH = {
  title: 'Procedimiento de prueba de idioma',
  steps: {
    isolate: { title: 'Corta la corriente', body: 'Apaga y bloquea el seccionador.', hazard: 'Un arranque inesperado puede herir las manos cerca de la fresa.', avoid: 'Bloquea el seccionador y comprueba que nada arranca.' },
    sign: { title: 'Firma el trabajo' },
  },
}

let trainee: { id: number, cookie: string }
let versionId: number
let procedureId: number
let machineId: number

beforeAll(async () => {
  const owner = await as('owner')
  // A trainee of their own, so the demo people keep their (English) language for other files.
  const email = `idioma-${Date.now()}@demo.jogwise.test`
  const made = await call('POST', '/api/users', { cookie: owner, body: { name: 'Lucía Prueba', email, role: 'trainee', password: 'aprendiz-prueba-1' } })
  expect(made.status, made.text).toBe(201)
  trainee = { id: made.body.id, cookie: await signIn(email, 'aprendiz-prueba-1') }
  const proc = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: PROCEDURE } })
  expect(proc.status, proc.text).toBe(201)
  versionId = proc.body.versionId
  procedureId = proc.body.id
  machineId = (await call('GET', '/api/machines', { cookie: owner })).body[0].id
})
afterAll(async () => { await db().end() })

describe('errors in the caller\'s language', () => {
  it('answers a signed-out caller by Accept-Language, keeping the issue paths', async () => {
    const en = await call('POST', '/api/auth/login', { body: { email: 'not an address', password: '' }, headers: { 'accept-language': 'en-US,en;q=0.9' } })
    const es = await call('POST', '/api/auth/login', { body: { email: 'not an address', password: '' }, headers: { 'accept-language': 'es-MX,es;q=0.9,en;q=0.5' } })
    expect(en.status).toBe(400)
    expect(es.status).toBe(400)
    expect(es.body.data.issues.map((i: any) => i.path)).toEqual(en.body.data.issues.map((i: any) => i.path))
    expect(en.body.data.issues.find((i: any) => i.path === 'email').message).toBe('Enter a valid e-mail address.')
    expect(es.body.data.issues.find((i: any) => i.path === 'email').message).toBe('Escribe un correo válido.')
    expect(es.body.message).toBe('email: Escribe un correo válido.')
  })

  it('follows the tablet\'s language cookie over the browser\'s', async () => {
    const res = await call('GET', '/api/me', { headers: { 'cookie': 'jogwise-lang=es', 'accept-language': 'en' } })
    expect(res.status).toBe(401)
    expect(res.body.message).toBe('Primero entra con tu cuenta.')
  })

  it('follows the person\'s own choice over the browser\'s, and their role errors too', async () => {
    const chose = await call('PATCH', '/api/me', { cookie: trainee.cookie, body: { language: 'es' } })
    expect(chose.status, chose.text).toBe(200)
    const res = await call('GET', '/api/users', { cookie: trainee.cookie, headers: { 'accept-language': 'en' } })
    expect(res.status).toBe(403)
    expect(res.body.message).toBe('Esto necesita el rol owner or trainer; has entrado como trainee.')
    const bad = await call('POST', `/api/machines/${machineId}/readings`, { cookie: trainee.cookie, body: {}, headers: { 'accept-language': 'en' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.length).toBeGreaterThan(0)
    // Every issue keeps a path; none is left in English where a template exists.
    for (const i of bad.body.data.issues) expect(typeof i.path).toBe('string')
    expect(bad.body.data.issues.map((i: any) => i.message).join(' ')).not.toMatch(/\b(is required|must be a number|Invalid input)\b/)
  })

  it('keeps English for the demo people, who never chose', async () => {
    const res = await call('GET', '/api/users', { cookie: await as('trainee') })
    expect(res.status).toBe(403)
    expect(res.body.message).toBe('This needs the owner or trainer role; you are signed in as trainee.')
  })
})

describe('choosing a language', () => {
  it('refuses a language Jogwise has no file for, naming the field', async () => {
    const res = await call('PATCH', '/api/me', { cookie: trainee.cookie, body: { language: 'xx' } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('language')
    const shape = await call('PATCH', '/api/me', { cookie: trainee.cookie, body: { language: 'Spanish' } })
    expect(shape.status).toBe(400)
    expect(shape.body.data.issues[0].path).toBe('language')
  })

  it('is kept in the profile and the session', async () => {
    const me = await call('GET', '/api/me', { cookie: trainee.cookie })
    expect(me.body.user.language).toBe('es')
    const [[row]] = await db().query<any[]>('select language from users where id = ?', [trainee.id])
    expect(row.language).toBe('es')
  })

  it('null hands the choice back to the browser', async () => {
    const other = `vuelta-${Date.now()}@demo.jogwise.test`
    const made = await call('POST', '/api/users', { cookie: await as('owner'), body: { name: 'Otro Prueba', email: other, role: 'operator', password: 'operario-prueba-1' } })
    const cookie = await signIn(other, 'operario-prueba-1')
    expect((await call('PATCH', '/api/me', { cookie, body: { language: 'es' } })).status).toBe(200)
    expect((await call('PATCH', '/api/me', { cookie, body: { language: null } })).status).toBe(200)
    const [[row]] = await db().query<any[]>('select language from users where id = ?', [made.body.id])
    expect(row.language).toBeNull()
  })
})

describe('a trainee in Spanish acknowledges a hold', () => {
  const runId = uuidv7()
  const at = (minute: number) => new Date(Date.UTC(2026, 1, 3, 9, minute)).toISOString()
  const ev = (type: string, minute: number, extra: Record<string, unknown> = {}) => ({ id: uuidv7(), runId, type, at: at(minute), actorId: trainee.id, deviceId: 'idioma-tablet', ...extra })

  it('writes a translation of the version (trainer), refusing a step it does not have', async () => {
    const wrong = await call('PUT', `/api/procedure-versions/${versionId}/translations/es`, { cookie: await as('trainer'), body: { steps: { nope: { title: 'No existe' } } } })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.issues[0].path).toBe('steps.nope')
    const notOperator = await call('PUT', `/api/procedure-versions/${versionId}/translations/es`, { cookie: trainee.cookie, body: SPANISH })
    expect(notOperator.status).toBe(403)
    const res = await call('PUT', `/api/procedure-versions/${versionId}/translations/es`, { cookie: await as('trainer'), body: SPANISH })
    expect(res.status, res.text).toBe(200)
    const version = await call('GET', `/api/procedure-versions/${versionId}`, { cookie: trainee.cookie })
    expect(version.body.translations.es.steps.isolate.title).toBe('Corta la corriente')
  })

  it('records the language on the event, the run and the Ledger', async () => {
    const ack = ev('hold.acknowledged', 1, { stepKey: 'isolate', lang: 'es' })
    const res = await call('POST', '/api/sync', { cookie: trainee.cookie, body: { deviceId: 'idioma-tablet', events: [
      ev('run.started', 0, { procedureVersionId: versionId, machineId, mode: 'guided' }), ack,
    ] } })
    expect(res.status, res.text).toBe(200)
    expect(res.body.rejected).toEqual([])
    const run = await call('GET', `/api/runs/${runId}`, { cookie: trainee.cookie })
    expect(run.body.events.find((e: any) => e.id === ack.id)).toMatchObject({ type: 'hold.acknowledged', lang: 'es' })
    const ledger = await call('GET', `/api/ledger?kind=hold-acknowledged&procedureId=${procedureId}`, { cookie: await as('owner') })
    const row = ledger.body.rows.find((r: any) => r.eventId === ack.id)
    expect(row.detail).toMatchObject({ lang: 'es', signalWord: 'WARNING' })
    expect(row.summary).toBe('Acknowledged the WARNING hold. Text on screen: es.')
    const csv = await fetch(`${process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/api/ledger/export.csv?kind=hold-acknowledged&procedureId=${procedureId}`, { headers: { cookie: await as('owner') } })
    const records = parse(await csv.text(), { columns: true, skip_empty_lines: true }) as Record<string, string>[]
    expect(records.find(r => r.Event === ack.id)?.['Language on screen']).toBe('es')
  })

  it('names the step of a Ledger entry on the run\'s record in the reader\'s language', async () => {
    await call('POST', '/api/sync', { cookie: trainee.cookie, body: { deviceId: 'idioma-tablet', events: [ev('step.done', 2, { stepKey: 'work' })] } })
    const trainer = (await call('GET', '/api/me', { cookie: await as('trainer') })).body.user
    // The demo trainer's PIN (server/utils/demo-shop.ts), sealed to this event; a seal lives 72 h.
    const signoff = { ...ev('signoff.given', 4, { stepKey: 'sign', signerId: trainer.id, signerRole: 'trainer', lang: 'es' }), at: new Date().toISOString() }
    Object.assign(signoff, { seal: await seal(trainee.cookie, { runId, stepKey: 'sign', signerId: trainer.id, eventId: signoff.id, time: signoff.at, pin: '2468' }) })
    const res = await call('POST', '/api/sync', { cookie: trainee.cookie, body: { deviceId: 'idioma-tablet', events: [signoff] } })
    expect(res.body.rejected, res.text).toEqual([])
    const summaryIn = async (language: string) => {
      const audit = await call('GET', `/api/runs/${runId}/audit`, { cookie: await as('trainer'), headers: { 'accept-language': language } })
      return audit.body.entries.find((e: any) => e.eventId === signoff.id)?.summary
    }
    expect(await summaryIn('es')).toBe('Signed off "Firma el trabajo" as trainer. Text on screen: es.')
    expect(await summaryIn('en')).toBe('Signed off "Sign off" as trainer. Text on screen: es.')
  })

  it('names the run\'s procedure on the Floor\'s list of runs in the reader\'s language', async () => {
    const titleIn = async (language: string) => {
      const runs = await call('GET', '/api/runs?status=active&limit=200', { cookie: await as('trainer'), headers: { 'accept-language': language } })
      return runs.body.find((r: any) => r.id === runId)?.procedureTitle
    }
    expect(await titleIn('es')).toBe(SPANISH.title)
    expect(await titleIn('en')).toBe(PROCEDURE.title)
  })

  it('refuses a language field that is not a language code, keeping the event visible as refused', async () => {
    const bad = ev('step.done', 2, { stepKey: 'work' })
    const badAck = { ...ev('hold.acknowledged', 3, { stepKey: 'isolate' }), lang: 'Español!' }
    const res = await call('POST', '/api/sync', { cookie: trainee.cookie, body: { deviceId: 'idioma-tablet', events: [bad, badAck] } })
    expect(res.status, res.text).toBe(200)
    const refused = res.body.rejected.find((r: any) => r.id === badAck.id)
    expect(refused).toBeTruthy()
    expect(JSON.stringify(refused)).toMatch(/lang/)
  })
})

describe('the due list in the reader\'s language', () => {
  it('names a translated procedure in Spanish and the others as written', async () => {
    const owner = await as('owner')
    // This file's procedure has a Spanish title (written above); an interval on it for a moment
    const made = await call('POST', '/api/maintenance-intervals', { cookie: owner, body: { procedureId, machineId, everyDays: 7 } })
    expect(made.status, made.text).toBe(201)
    try {
      const titleIn = async (language: string) => {
        const due = await call('GET', '/api/due', { cookie: owner, headers: { 'accept-language': language } })
        expect(due.status).toBe(200)
        return due.body.find((d: any) => d.intervalId === made.body.id)?.procedureTitle
      }
      expect(await titleIn('es')).toBe(SPANISH.title)
      expect(await titleIn('en')).toBe(PROCEDURE.title)
    }
    finally {
      await call('DELETE', `/api/maintenance-intervals/${made.body.id}`, { cookie: owner })
    }
  })
})

describe('procedure translations across versions', () => {
  it('publishing a new version keeps translations of unchanged steps as drafts', async () => {
    const changed = { ...PROCEDURE, steps: PROCEDURE.steps.map(s => s.key === 'work' ? { ...s, body: 'Do the work with the power off and locked.' } : s) }
    const res = await call('PUT', `/api/procedures/${procedureId}`, { cookie: await as('trainer'), body: { procedure: changed, changeNote: 'Clearer work step' } })
    expect(res.status, res.text).toBe(200)
    const next = await call('GET', `/api/procedure-versions/${res.body.versionId}`, { cookie: await as('trainer') })
    expect(next.body.translations.es.steps.isolate).toMatchObject({ title: 'Corta la corriente', draft: true })
    expect(next.body.translations.es.steps.work).toBeUndefined()
  })

  it('the starter library comes with Spanish', async () => {
    const list = await call('GET', '/api/procedures', { cookie: await as('operator') })
    const resurfacing = list.body.find((p: any) => p.current.title === 'Resurface the spoilboard')
    expect(resurfacing.current.translations.es.title).toBe('Planear la tabla de sacrificio')
    expect(resurfacing.current.translations.es.steps['isolate-power'].hazard).toMatch(/descarga eléctrica/)
  })
})
