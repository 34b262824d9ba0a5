import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, otherShop } from './client'

// The shop's cutter list: owners and trainers keep it, everyone reads it, shops stay apart.
const CUTTER = { name: 'Tools test facing cutter', kind: 'surfacing', diameterMm: 25.4, flutes: 3, cornerRadiusMm: 0.4, maxRpm: 18000 }

let other: Awaited<ReturnType<typeof otherShop>>
let theirsId: number
beforeAll(async () => {
  other = await otherShop()
  const [row] = await db().query<any>('insert into tools (shop_id, name, kind, diameter_mm, flutes, max_rpm) values (?, ?, ?, ?, ?, ?)', [other.shopId, 'Other shop cutter', 'v-bit', 12.7, 2, 24000])
  theirsId = row.insertId
})
afterAll(async () => { await db().end() })

describe('/api/tools', () => {
  it('owner and trainer add, change and remove a cutter; everyone reads the list', async () => {
    for (const role of ['owner', 'trainer'] as const) {
      const cookie = await as(role)
      const made = await call('POST', '/api/tools', { cookie, body: { ...CUTTER, name: `${CUTTER.name} by ${role}` } })
      expect(made.status, made.text).toBe(201)
      expect(made.body).toMatchObject({ ...CUTTER, name: `${CUTTER.name} by ${role}`, notes: null })
      expect(made.body).not.toHaveProperty('shopId')
      for (const reader of ['owner', 'trainer', 'operator', 'trainee'] as const) {
        const list = await call('GET', '/api/tools', { cookie: await as(reader) })
        expect(list.body.map((t: any) => t.id)).toContain(made.body.id)
        expect(list.text).not.toContain('Other shop cutter')
      }
      const changed = await call('PATCH', `/api/tools/${made.body.id}`, { cookie, body: { maxRpm: 16000, notes: 'Inserts turned once.' } })
      expect(changed.status, changed.text).toBe(200)
      expect(changed.body).toMatchObject({ maxRpm: 16000, notes: 'Inserts turned once.', diameterMm: 25.4 })
      const gone = await call('DELETE', `/api/tools/${made.body.id}`, { cookie })
      expect(gone.status).toBe(200)
      expect((await call('GET', '/api/tools', { cookie })).body.map((t: any) => t.id)).not.toContain(made.body.id)
    }
  })

  it('operators and trainees may not change the list', async () => {
    const made = await call('POST', '/api/tools', { cookie: await as('owner'), body: { ...CUTTER, name: 'Tools test locked cutter' } })
    for (const role of ['operator', 'trainee'] as const) {
      const cookie = await as(role)
      expect((await call('POST', '/api/tools', { cookie, body: CUTTER })).status).toBe(403)
      expect((await call('PATCH', `/api/tools/${made.body.id}`, { cookie, body: { maxRpm: 1000 } })).status).toBe(403)
      expect((await call('DELETE', `/api/tools/${made.body.id}`, { cookie })).status).toBe(403)
    }
    expect((await call('GET', '/api/tools')).status).toBe(401)
  })

  it('names every bad field with a bound (sizes, flutes, speed, corner radius)', async () => {
    const cookie = await as('owner')
    const res = await call('POST', '/api/tools', { cookie, body: { name: '', kind: 'laser', diameterMm: 0.1, flutes: 0, cornerRadiusMm: -1, maxRpm: 90000, colour: 'red' } })
    expect(res.status).toBe(400)
    const paths = res.body.data.issues.map((i: any) => i.path)
    expect(paths).toEqual(expect.arrayContaining(['name', 'kind', 'diameterMm', 'flutes', 'cornerRadiusMm', 'maxRpm']))
    expect(res.text).not.toMatch(/at .*\.(mjs|js|ts):\d+|ZodError/)
    // A corner radius of more than half the diameter is not a cutter (a ball nose is exactly half).
    const radius = await call('POST', '/api/tools', { cookie, body: { ...CUTTER, diameterMm: 6, cornerRadiusMm: 3.5 } })
    expect(radius.body.data.issues).toEqual([{ path: 'cornerRadiusMm', message: 'The corner radius cannot be more than half the diameter.' }])
    const made = await call('POST', '/api/tools', { cookie, body: { ...CUTTER, name: 'Tools test radius', diameterMm: 6, cornerRadiusMm: 3 } })
    expect(made.status).toBe(201)
    const shrink = await call('PATCH', `/api/tools/${made.body.id}`, { cookie, body: { diameterMm: 4 } })
    expect(shrink.status).toBe(400)
    expect(shrink.body.data.issues.map((i: any) => i.path)).toEqual(['cornerRadiusMm'])
    expect((await call('PATCH', `/api/tools/${made.body.id}`, { cookie, body: {} })).status).toBe(400)
  })

  it('another shop\'s cutter is not found, and theirs never lists ours', async () => {
    const cookie = await as('owner')
    expect((await call('PATCH', `/api/tools/${theirsId}`, { cookie, body: { maxRpm: 1000 } })).status).toBe(404)
    expect((await call('DELETE', `/api/tools/${theirsId}`, { cookie })).status).toBe(404)
    const [[still]] = await db().query<any[]>('select max_rpm from tools where id = ?', [theirsId])
    expect(still.max_rpm).toBe(24000)
    const theirs = await call('GET', '/api/tools', { cookie: other.cookie })
    expect(theirs.body.map((t: any) => t.name)).toEqual(['Other shop cutter'])
    expect((await call('PATCH', '/api/tools/abc', { cookie, body: { maxRpm: 1000 } })).status).toBe(404)
  })
})
