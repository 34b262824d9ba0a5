import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { v7 as uuidv7 } from 'uuid'
import { as, call, db, DEMO, otherShop, signIn, type DemoRole } from './client'
import { discoverRoutes } from './discover'

const MATRIX_PROCEDURE = {
  title: 'Matrix check procedure',
  summary: 'A short procedure used by the route checks.',
  category: 'daily',
  steps: [
    { key: 'look', kind: 'instruction', title: 'Look at the machine', body: 'Look at the machine.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'I looked at the machine.' },
  ],
}

// Every route under server/api, found on disk, must have a row here saying who may call it.
// A new route without a row fails the first test, so no route ships without a decision.
type Who = DemoRole | 'anyone'
interface Row { allowed: Who[], probe: (ctx: Ctx) => { path: string, body?: unknown }, okStatus: number, crossShop?: boolean }
interface Ctx { machineId: number, userId: number, procedureId: number, versionId: number, runId: string }

const everyone: Who[] = ['owner', 'trainer', 'operator', 'trainee']
const ROUTES: Record<string, Row> = {
  'GET /api/health': { allowed: ['anyone'], probe: () => ({ path: '/api/health' }), okStatus: 200 },
  'POST /api/auth/login': { allowed: ['anyone'], probe: () => ({ path: '/api/auth/login', body: {} }), okStatus: 400 },
  'POST /api/auth/logout': { allowed: everyone, probe: () => ({ path: '/api/auth/logout' }), okStatus: 200 },
  'GET /api/me': { allowed: everyone, probe: () => ({ path: '/api/me' }), okStatus: 200 },
  'PATCH /api/me': { allowed: everyone, probe: () => ({ path: '/api/me', body: {} }), okStatus: 400 },
  'PUT /api/procedure-versions/[id]/translations/[lang]': { allowed: ['owner', 'trainer'], probe: c => ({ path: `/api/procedure-versions/${c.versionId}/translations/es`, body: {} }), okStatus: 400, crossShop: true },
  'GET /api/users': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/users' }), okStatus: 200 },
  // Bodies are empty on purpose: an allowed role gets 400 from validation and nothing changes.
  'POST /api/users': { allowed: ['owner'], probe: () => ({ path: '/api/users', body: {} }), okStatus: 400 },
  'PATCH /api/users/[id]': { allowed: ['owner'], probe: c => ({ path: `/api/users/${c.userId}`, body: {} }), okStatus: 400 },
  'GET /api/machines': { allowed: everyone, probe: () => ({ path: '/api/machines' }), okStatus: 200 },
  'POST /api/machines': { allowed: ['owner'], probe: () => ({ path: '/api/machines', body: {} }), okStatus: 400 },
  'GET /api/machines/[id]': { allowed: everyone, probe: c => ({ path: `/api/machines/${c.machineId}` }), okStatus: 200, crossShop: true },
  'PATCH /api/machines/[id]': { allowed: ['owner'], probe: c => ({ path: `/api/machines/${c.machineId}`, body: {} }), okStatus: 400, crossShop: true },
  'POST /api/machines/[id]/retire': { allowed: ['owner'], probe: c => ({ path: `/api/machines/${c.machineId}/retire` }), okStatus: 200, crossShop: true },
  'POST /api/machines/[id]/reinstate': { allowed: ['owner'], probe: c => ({ path: `/api/machines/${c.machineId}/reinstate` }), okStatus: 200, crossShop: true },
  'GET /api/machines/[id]/facings': { allowed: everyone, probe: c => ({ path: `/api/machines/${c.machineId}/facings` }), okStatus: 200, crossShop: true },
  'GET /api/machines/[id]/readings': { allowed: everyone, probe: c => ({ path: `/api/machines/${c.machineId}/readings` }), okStatus: 200, crossShop: true },
  'POST /api/machines/[id]/readings': { allowed: everyone, probe: c => ({ path: `/api/machines/${c.machineId}/readings`, body: {} }), okStatus: 400, crossShop: true },
  'GET /api/procedures': { allowed: everyone, probe: () => ({ path: '/api/procedures' }), okStatus: 200 },
  'POST /api/procedures': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/procedures', body: {} }), okStatus: 400 },
  'GET /api/procedures/[id]': { allowed: everyone, probe: c => ({ path: `/api/procedures/${c.procedureId}` }), okStatus: 200, crossShop: true },
  'PUT /api/procedures/[id]': { allowed: ['owner', 'trainer'], probe: c => ({ path: `/api/procedures/${c.procedureId}`, body: {} }), okStatus: 400, crossShop: true },
  'POST /api/procedures/[id]/retire': { allowed: ['owner', 'trainer'], probe: c => ({ path: `/api/procedures/${c.procedureId}/retire` }), okStatus: 200, crossShop: true },
  'GET /api/procedure-versions/[id]': { allowed: everyone, probe: c => ({ path: `/api/procedure-versions/${c.versionId}` }), okStatus: 200, crossShop: true },
  'GET /api/qualifications': { allowed: everyone, probe: () => ({ path: '/api/qualifications' }), okStatus: 200 },
  'PUT /api/qualifications': { allowed: ['owner'], probe: () => ({ path: '/api/qualifications', body: {} }), okStatus: 400 },
  'GET /api/signers': { allowed: everyone, probe: () => ({ path: '/api/signers' }), okStatus: 200 },
  'POST /api/sync': { allowed: everyone, probe: () => ({ path: '/api/sync', body: {} }), okStatus: 400 },
  'GET /api/runs': { allowed: everyone, probe: () => ({ path: '/api/runs' }), okStatus: 200 },
  'GET /api/runs/[id]': { allowed: everyone, probe: c => ({ path: `/api/runs/${c.runId}` }), okStatus: 200, crossShop: true },
  'POST /api/plans/surfacing': { allowed: everyone, probe: () => ({ path: '/api/plans/surfacing', body: {} }), okStatus: 400 },
  'GET /api/plans/[id]': { allowed: everyone, probe: () => ({ path: '/api/plans/999999999' }), okStatus: 404 },
  // An empty photo to a fresh id: allowed roles get 400 and nothing is stored.
  'PUT /api/uploads/[id]': { allowed: everyone, probe: c => ({ path: `/api/uploads/${crypto.randomUUID()}?runId=${c.runId}` }), okStatus: 400, crossShop: true },
  'POST /api/paper-runs': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/paper-runs', body: {} }), okStatus: 400 },
  'PUT /api/paper-runs/[id]/sheet': { allowed: ['owner', 'trainer'], probe: c => ({ path: `/api/paper-runs/${c.runId}/sheet`, body: {} }), okStatus: 400, crossShop: true },
  'GET /api/shop': { allowed: everyone, probe: () => ({ path: '/api/shop' }), okStatus: 200 },
  'PATCH /api/shop': { allowed: ['owner'], probe: () => ({ path: '/api/shop', body: {} }), okStatus: 400 },
  'GET /api/uploads/[id]': { allowed: everyone, probe: () => ({ path: `/api/uploads/${crypto.randomUUID()}` }), okStatus: 404 },
  'GET /api/invites': { allowed: ['owner'], probe: () => ({ path: '/api/invites' }), okStatus: 200 },
  'POST /api/invites': { allowed: ['owner'], probe: () => ({ path: '/api/invites', body: {} }), okStatus: 400 },
  'POST /api/invites/[id]/revoke': { allowed: ['owner'], probe: () => ({ path: '/api/invites/999999999/revoke' }), okStatus: 404 },
  // Opened from an invite link, signed out: the token is the credential; none here → 400.
  'GET /api/invites/preview': { allowed: ['anyone'], probe: () => ({ path: '/api/invites/preview' }), okStatus: 400 },
  'POST /api/invites/accept': { allowed: ['anyone'], probe: () => ({ path: '/api/invites/accept', body: {} }), okStatus: 400 },
  'GET /api/mail/outbox': { allowed: ['owner'], probe: () => ({ path: '/api/mail/outbox' }), okStatus: 200 },
  // scripts/test.sh runs the fake mail server, so the caught-mail list is on.
  'GET /api/mail/caught': { allowed: ['owner'], probe: () => ({ path: '/api/mail/caught' }), okStatus: 200 },
  'POST /api/mail/digest': { allowed: ['owner'], probe: () => ({ path: '/api/mail/digest' }), okStatus: 200 },
  'POST /api/runs/[id]/signoff-check': { allowed: everyone, probe: c => ({ path: `/api/runs/${c.runId}/signoff-check`, body: {} }), okStatus: 400, crossShop: true },
  'GET /api/signoff-key': { allowed: everyone, probe: () => ({ path: '/api/signoff-key' }), okStatus: 200 },
  'GET /api/runs/[id]/audit': { allowed: everyone, probe: c => ({ path: `/api/runs/${c.runId}/audit` }), okStatus: 200, crossShop: true },
  'GET /api/ledger': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/ledger' }), okStatus: 200 },
  // A bad filter, so an allowed role gets a JSON 400 rather than a CSV download.
  'GET /api/ledger/export.csv': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/ledger/export.csv?kind=nope' }), okStatus: 400 },
  'GET /api/ledger/runs': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/ledger/runs' }), okStatus: 200 },
  'GET /api/due': { allowed: everyone, probe: () => ({ path: '/api/due' }), okStatus: 200 },
  'GET /api/tools': { allowed: everyone, probe: () => ({ path: '/api/tools' }), okStatus: 200 },
  'POST /api/tools': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/tools', body: {} }), okStatus: 400 },
  'PATCH /api/tools/[id]': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/tools/999999999', body: {} }), okStatus: 404 },
  'DELETE /api/tools/[id]': { allowed: ['owner', 'trainer'], probe: () => ({ path: '/api/tools/999999999' }), okStatus: 404 },
  'GET /api/maintenance-intervals': { allowed: everyone, probe: () => ({ path: '/api/maintenance-intervals' }), okStatus: 200 },
  'POST /api/maintenance-intervals': { allowed: ['owner'], probe: () => ({ path: '/api/maintenance-intervals', body: {} }), okStatus: 400 },
  'PATCH /api/maintenance-intervals/[id]': { allowed: ['owner'], probe: () => ({ path: '/api/maintenance-intervals/999999999', body: {} }), okStatus: 404 },
  'DELETE /api/maintenance-intervals/[id]': { allowed: ['owner'], probe: () => ({ path: '/api/maintenance-intervals/999999999' }), okStatus: 404 },
}

let ctx: Ctx
let other: Awaited<ReturnType<typeof otherShop>>
beforeAll(async () => {
  const owner = await as('owner')
  const machine = await call('POST', '/api/machines', { cookie: owner, body: {
    name: `Matrix Router ${Date.now()}`, travelXMm: 600, travelYMm: 400, travelZMm: 80, units: 'mm',
    spindleKind: 'air-spindle', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12,
  } })
  const user = await call('POST', '/api/users', { cookie: owner, body: { name: 'Matrix Person', email: `matrix-${Date.now()}@demo.jogwise.test`, role: 'operator', password: 'matrix-password' } })
  other = await otherShop()
  const procedure = await call('POST', '/api/procedures', { cookie: owner, body: { procedure: MATRIX_PROCEDURE } })
  if (procedure.status !== 201) throw new Error(procedure.text)
  const runId = uuidv7()
  const started = await call('POST', '/api/sync', { cookie: owner, body: { deviceId: 'matrix', events: [{
    id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: (await call('GET', '/api/me', { cookie: owner })).body.user.id,
    deviceId: 'matrix', procedureVersionId: procedure.body.versionId, machineId: machine.body.id, mode: 'solo',
  }] } })
  if (started.body.accepted?.length !== 1) throw new Error(started.text)
  ctx = { machineId: machine.body.id, userId: user.body.id, procedureId: procedure.body.id, versionId: procedure.body.versionId, runId }
})
afterAll(async () => { await db().end() })

describe('route × role matrix', () => {
  it('has a row for every route on disk and no row for a missing route', () => {
    expect(discoverRoutes()).toEqual(Object.keys(ROUTES).sort())
  })

  const cases = Object.entries(ROUTES).flatMap(([key, row]) =>
    (['none', 'owner', 'trainer', 'operator', 'trainee'] as const).map(who => [key, who, row] as const))

  it.each(cases)('%s as %s', async (key, who, row) => {
    const method = key.split(' ')[0]!
    const { path, body } = row.probe(ctx)
    // Logging out would end the shared session; give it a fresh one.
    const cookie = who === 'none' ? undefined : key === 'POST /api/auth/logout' ? await signIn(DEMO[who]) : await as(who)
    const res = await call(method, path, { cookie, body })
    const expected = row.allowed.includes('anyone') || (who !== 'none' && row.allowed.includes(who))
      ? row.okStatus
      : who === 'none' ? 401 : 403
    expect(res.status, res.text).toBe(expected)
    expect(res.body, 'answers JSON').toBeTypeOf('object')
    expect(res.text).not.toMatch(/at .*\.(mjs|js|ts):\d+|sqlMessage|ER_[A-Z_]+/)
  })

  const crossShop = Object.entries(ROUTES).filter(([, r]) => r.crossShop)
  it.each(crossShop)('%s on another shop\'s row answers 404 with none of its data', async (key, row) => {
    const method = key.split(' ')[0]!
    const { path, body } = row.probe({ ...ctx, machineId: other.machineId, procedureId: other.procedureId, versionId: other.versionId, runId: other.runId })
    const res = await call(method, path, { cookie: await as('owner'), body })
    expect(res.status).toBe(404)
    expect(res.text).not.toMatch(/Other Router|Other procedure/)
    // and the other shop's owner cannot see ours
    const back = await call('GET', `/api/machines/${ctx.machineId}`, { cookie: other.cookie })
    expect(back.status).toBe(404)
  })

  it('lists only the signed-in shop\'s machines and people', async () => {
    const mine = await call('GET', '/api/machines', { cookie: other.cookie })
    expect(mine.body.map((m: any) => m.name)).toEqual(['Other Router'])
    const people = await call('GET', '/api/users', { cookie: other.cookie })
    expect(people.body.every((p: any) => p.email.endsWith('@other.jogwise.test'))).toBe(true)
  })
})
