import { afterAll, describe, expect, it } from 'vitest'
import { as, call, db } from './client'

// The shop's paper size for printed procedure sheets (issue 17): A4 (ISO 216) or Letter
// (ANSI/ASME Y14.1), set by the owner, read by every member.
afterAll(async () => {
  await call('PATCH', '/api/shop', { cookie: await as('owner'), body: { paperSize: 'a4' } })
  await db().end()
})

describe('/api/shop', () => {
  it('the owner sets Letter and every member reads it', async () => {
    const set = await call('PATCH', '/api/shop', { cookie: await as('owner'), body: { paperSize: 'letter' } })
    expect(set.status, set.text).toBe(200)
    expect(set.body.paperSize).toBe('letter')
    const read = await call('GET', '/api/shop', { cookie: await as('trainee') })
    expect(read.body).toMatchObject({ id: set.body.id, paperSize: 'letter' })
  })

  it.each([
    [{ paperSize: 'a3' }, 'paperSize'],
    [{ paperSize: 4 }, 'paperSize'],
    [{}, 'paperSize'],
    [{ paperSize: 'a4', name: 'Renamed' }, ''],
  ])('refuses %j naming the field', async (body, path) => {
    const res = await call('PATCH', '/api/shop', { cookie: await as('owner'), body })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path)).toContain(path)
  })

  it('a trainer may not change it', async () => {
    const res = await call('PATCH', '/api/shop', { cookie: await as('trainer'), body: { paperSize: 'a4' } })
    expect(res.status).toBe(403)
  })
})
