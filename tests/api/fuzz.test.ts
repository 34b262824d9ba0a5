import { readFileSync } from 'node:fs'
import fc from 'fast-check'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, BASE_URL, call, db } from './client'
import { discoverRouteFiles } from './discover'

// Property-based bad input (fast-check) against every JSON route of the real server, signed in
// as the owner, the role that may call the most. Every input here is invalid by construction
// (an unknown field for our strict schemas, a wrong top-level type, malformed JSON, a bad id or
// query value), so every answer must be a 4xx with a JSON message, never a 5xx, and the
// database must be exactly as before (row counts and CHECKSUM TABLE of every table).
// The 2 MB body cap is server/middleware/api-guard.ts.

const RUNS = Number(process.env.JOGWISE_FUZZ_RUNS || 30)
const MB = 1024 * 1024
// A fixed seed by default, so `npm test` gives the same answer twice; `npm run fuzz` draws a new
// one for deeper runs and prints it, and JOGWISE_FUZZ_SEED replays any run exactly.
const SEED = Number(process.env.JOGWISE_FUZZ_SEED || 20261203)
let tried = 0
const perRoute: Record<string, number> = {}

const routes = discoverRouteFiles().map(r => ({ ...r, source: readFileSync(r.file, 'utf8') }))
// Signing out would end the session the fuzzing uses; it reads nothing a client sends.
const SKIP = new Set(['POST /api/auth/logout'])
const bodyRoutes = routes.filter(r => r.method !== 'GET' && !SKIP.has(r.key) && /readValid\(|readBody\(/.test(r.source))
const queryRoutes = routes.filter(r => !SKIP.has(r.key) && /queryValid\(|getQuery\(/.test(r.source))
const paramRoutes = routes.filter(r => !SKIP.has(r.key) && r.path.includes('['))

// ---- values -------------------------------------------------------------------------------

const FIELD_NAMES = ['email', 'password', 'name', 'role', 'pin', 'active', 'id', 'machineId', 'runId', 'userId', 'procedureId',
  'signerId', 'qualified', 'deviceId', 'events', 'procedure', 'steps', 'changeNote', 'units', 'area', 'cutter', 'token',
  'travelXMm', 'spoilboardMinMm', 'readings', 'grid', 'spacing', 'notes', 'type', 'at', 'title', 'key', 'kind']
const PROTO_KEYS = ['__proto__', 'constructor', 'prototype']
const SPECIAL_STRINGS = ['', ' ', '\u0000', 'a\u0000b', '\ud800', '\udfff', 'x\ud83d', '\u202eevil\u202c', 'مرحبا بالعالم', 'שלום',
  '\ufeff', '💥🔥', 'e\u0301', '\r\n', '<script>alert(1)</script>', '\'; drop table users; --', '../../etc/passwd',
  'null', 'NaN', 'Infinity', '-1', '1e309', '0x10', 'true', '{}', '[]']
const SPECIAL_NUMBERS = [-0, -1, 0, 0.5, -1e308, 1e308, 5e-324, 2 ** 31, -(2 ** 31) - 1, 2 ** 53 + 2, -(2 ** 63), Number.MAX_VALUE]

const text = fc.oneof(
  fc.constantFrom(...SPECIAL_STRINGS),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 20 }),
  // longer than any column the API writes (varchar and text alike)
  fc.integer({ min: 256, max: 70_000 }).map(n => 'ÿ'.repeat(n)),
)
const number = fc.oneof(fc.constantFrom(...SPECIAL_NUMBERS), fc.double(), fc.integer(), fc.bigInt({ min: -(2n ** 80n), max: 2n ** 80n }).map(Number))
const leaf = fc.oneof(text, number, fc.boolean(), fc.constant(null))
const fieldKey = fc.oneof(fc.constantFrom(...FIELD_NAMES), fc.constantFrom(...PROTO_KEYS), fc.string({ unit: 'binary', maxLength: 12 }))
const { value } = fc.letrec(tie => ({
  value: fc.oneof({ depthSize: 'small', maxDepth: 4 }, leaf, fc.array(tie('value'), { maxLength: 4 }), fc.dictionary(fieldKey, tie('value'), { maxKeys: 5 })),
}))

/** JSON text of an object; written by hand so __proto__ stays an own key on the wire. */
function objectText(entries: [string, unknown][]) {
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${JSON.stringify(v) ?? 'null'}`).join(',')}}`
}
const deep = (depth: number, open = '[', close = ']') => open.repeat(depth) + close.repeat(depth)

// A body that no route accepts: a wrong top-level type, or an object that always carries a
// field no schema has (the schemas are strict: an unknown field is a 400, never dropped).
const body = fc.oneof(
  { weight: 3, arbitrary: fc.tuple(fc.array(fc.tuple(fieldKey, value), { maxLength: 6 }), fc.string({ unit: 'grapheme-ascii', minLength: 1, maxLength: 8 }), value)
    .map(([entries, tag, v]) => objectText([...entries, [`fuzzUnknown_${tag}`, v]])) },
  { weight: 1, arbitrary: fc.oneof(leaf, fc.array(value, { maxLength: 5 })).map(v => JSON.stringify(v) ?? 'null') },
  { weight: 1, arbitrary: fc.tuple(fc.constantFrom(...FIELD_NAMES), value).map(([k, v]) => objectText([['__proto__', { role: 'owner', active: true, [k]: v }], ['constructor', { prototype: { isAdmin: true } }], ['fuzzUnknown', 1]])) },
  { weight: 1, arbitrary: fc.constantFrom('{', '{"a":', '{"a":NaN}', '{"a":Infinity}', '{"a":1e999,"fuzzUnknown":1}', '[1,]', 'undefined', '\u0000', '{"a":"\\ud800"', 'nul', '{"__proto__":}') },
)

// Issue 18 shapes. A lone UTF-16 surrogate (Unicode section 3.9, D91: ill-formed) somewhere in
// a text, and finite numbers far beyond any field's range (up to Number.MAX_VALUE, IEEE 754).
const loneSurrogate = fc.tuple(fc.string({ maxLength: 12 }), fc.integer({ min: 0xD800, max: 0xDFFF }), fc.string({ maxLength: 12 }))
  .map(([a, code, b]) => `${a}${String.fromCharCode(code)}${code < 0xDC00 ? 'x' : ''}${b}`)
const hugeNumber = fc.oneof(fc.double({ min: 1e16, max: Number.MAX_VALUE, noNaN: true }), fc.constantFrom(3e303, 7e306, -1e300, Number.MAX_VALUE))
const TOP_FIELDS = FIELD_NAMES.filter(n => n !== 'events')

/** Percent-encoding that also carries lone surrogates (as the bytes a broken client sends). */
function enc(s: string) {
  try { return encodeURIComponent(s) }
  catch { return s.split('').map(encOne).join('') }
}
function encOne(c: string) {
  try { return encodeURIComponent(c) }
  catch { return '%ED%A0%80' }
}

// A query value no schema accepts: every enum, number and id here is one letter-led or out of range.
// Long values stay well under Node's 16 KB limit on the request head, past which Node itself
// answers 431 before Jogwise sees the request.
const badQueryValue = fc.oneof(
  fc.constantFrom('', ' ', 'NaN', 'Infinity', '-Infinity', '-1', '0', '-0', '1e309', '1.5', '99999999999999999999999', 'null', 'true', '[]', '%00', '\u0000', '\ud800', '\u202e', 'ÿ'.repeat(1000)),
  fc.string({ unit: 'binary', maxLength: 30 }).map(s => `~${s}`),
  fc.integer({ max: 0 }).map(String),
)

/** The query names a route's own QuerySchema declares, else the names our routes use. */
function queryNames(source: string) {
  const block = source.match(/const QuerySchema = z\.object\(\{([\s\S]*?)\n\}\)/)?.[1]
  const names = block ? [...block.matchAll(/^\s{2}(\w+):/gm)].map(m => m[1]!) : []
  return names.length ? names : ['token', 'limit', 'status', 'machineId', 'runId', 'retired']
}

// An id no route has: letter-led, negative, fractional, enormous or made of odd characters.
const badId = fc.oneof(
  fc.constantFrom('abc', '-1', '0', '1.5', '1e3x', 'NaN', 'Infinity', '99999999999999999999999999', '9'.repeat(400), '%00', '..', '%2e%2e', '\u0000', '\ud800', '\u202e1', '__proto__', 'constructor', ' 1x', '１'),
  fc.string({ unit: 'binary', minLength: 1, maxLength: 30 }).map(s => `z${s}`),
  fc.integer({ max: -1 }).map(String),
)

// ---- the database --------------------------------------------------------------------------

async function snapshot() {
  const [tables] = await db().query<any[]>('select table_name as t from information_schema.tables where table_schema = database() and table_type = \'BASE TABLE\' order by table_name')
  const names: string[] = tables.map(r => r.t)
  const [sums] = await db().query<any[]>(`checksum table ${names.map(n => `\`${n}\``).join(', ')}`)
  const out: Record<string, string> = {}
  for (const n of names) {
    // The app servers renew their work leases (mail sender, digest) on every tick, whatever the
    // requests: only the number of lease rows is compared.
    if (n === 'worker_leases') {
      const [[{ c }]] = await db().query<any[]>('select count(*) as c from `worker_leases`')
      out[n] = `${c} rows`
      continue
    }
    const [[{ c }]] = await db().query<any[]>(`select count(*) as c from \`${n}\``)
    const sum = sums.find(s => String(s.Table).endsWith(`.${n}`))?.Checksum
    out[n] = `${c} rows, checksum ${sum}`
  }
  return out
}

// ---- asking --------------------------------------------------------------------------------

let owner: string
let before: Record<string, string>
const ids: Record<string, string> = {}

/** The address of a route with its ids filled from the owner's shop, so checks reach the body. */
function realPath(path: string) {
  return path.replace(/\/([^/]+)\/\[(\w+)\]/g, (_, resource: string) => `/${resource}/${ids[resource] ?? '1'}`)
}

async function send(method: string, path: string, raw?: string) {
  tried++
  const res = await fetch(BASE_URL + path, {
    method,
    headers: { cookie: owner, accept: 'application/json', ...(raw !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: raw,
  })
  const text = await res.text()
  let json: any
  try { json = JSON.parse(text) }
  catch {}
  return { status: res.status, text, json }
}

function expectClear4xx(what: string, res: { status: number, text: string, json: any }) {
  expect(res.status, `${what} → ${res.status} ${res.text.slice(0, 300)}`).toBeGreaterThanOrEqual(400)
  expect(res.status, `${what} → ${res.status} ${res.text.slice(0, 300)}`).toBeLessThan(500)
  expect(typeof res.json?.message, `${what}: a JSON message`).toBe('string')
  expect(res.json.message.length).toBeGreaterThan(0)
  expect(res.text).not.toMatch(/at .*\.(mjs|js|ts):\d+|sqlMessage|ER_[A-Z_]+/)
  // a 400 names the fields (server/utils/validation.ts)
  if (res.status === 400) expect(Array.isArray(res.json.data?.issues), `${what}: data.issues`).toBe(true)
}

beforeAll(async () => {
  owner = await as('owner')
  const me = (await call('GET', '/api/me', { cookie: owner })).body.user
  const machines = (await call('GET', '/api/machines', { cookie: owner })).body
  const procedures = (await call('GET', '/api/procedures', { cookie: owner })).body
  const operator = (await call('GET', '/api/users', { cookie: owner })).body.find((u: any) => u.role === 'operator')
  const runId = uuidv7()
  const started = await call('POST', '/api/sync', { cookie: owner, body: { deviceId: 'fuzz', events: [{
    id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: me.id, deviceId: 'fuzz',
    procedureVersionId: procedures[0].current.id, machineId: machines[0].id, mode: 'solo',
  }] } })
  if (started.body.accepted?.length !== 1) throw new Error(started.text)
  Object.assign(ids, {
    'machines': String(machines[0].id), 'procedures': String(procedures[0].id), 'procedure-versions': String(procedures[0].current.id),
    'users': String(operator.id), 'runs': runId, 'uploads': crypto.randomUUID(), 'paper-runs': runId,
    // The language of a translation: a locale that exists, so the body is what gets checked.
    'translations': 'es',
  })
  before = await snapshot()
}, 60_000)

afterAll(async () => {
  console.log(`fuzz: ${tried} inputs tried on ${Object.keys(perRoute).length} routes (seed ${SEED}, ${RUNS} runs per property)`)
  await db().end()
})

describe('bad input never gets a 5xx and never changes the database', () => {
  it('finds the routes to fuzz on disk', () => {
    expect(bodyRoutes.length).toBeGreaterThan(5)
    expect(queryRoutes.length).toBeGreaterThan(2)
    expect(paramRoutes.length).toBeGreaterThan(5)
  })

  describe.each(bodyRoutes.map(r => [r.key, r] as const))('body of %s', (key, route) => {
    it('answers 4xx for generated bodies', async () => {
      const path = realPath(route.path)
      await fc.assert(fc.asyncProperty(body, async (raw) => {
        perRoute[key] = (perRoute[key] ?? 0) + 1
        expectClear4xx(`${key} ${raw.slice(0, 120)}`, await send(route.method, path, raw))
      }), { numRuns: RUNS, seed: SEED })
    })

    it('answers 400 naming the field for a lone surrogate or a huge finite number anywhere', async () => {
      const path = realPath(route.path)
      const poisoned = fc.tuple(fc.constantFrom(...TOP_FIELDS), fc.oneof(loneSurrogate, hugeNumber), fc.boolean())
      await fc.assert(fc.asyncProperty(poisoned, async ([field, bad, nested]) => {
        perRoute[key] = (perRoute[key] ?? 0) + 1
        const raw = objectText([[field, nested ? { inner: [bad] } : bad], ['fuzzUnknown', 1]])
        const res = await send(route.method, path, raw)
        expectClear4xx(`${key} ${raw.slice(0, 120)}`, res)
        expect(res.status, `${key} ${raw.slice(0, 120)}`).toBe(400)
        expect(res.json.data.issues[0].path, `${key} ${raw.slice(0, 120)}`).toBe(nested ? `${field}.inner.0` : field)
        expect(res.json.data.issues[0].message).toMatch(typeof bad === 'string' ? /surrogate/ : /number must be between/)
      }), { numRuns: RUNS, seed: SEED })
    })

    it('answers a chunked body (no Content-Length) like a sized one: 4xx under 2 MB, 413 past it', async () => {
      const path = realPath(route.path)
      for (const [name, size] of [['small', 100], ['just under 2 MB', 2 * MB - 64], ['past 2 MB', 3 * MB]] as const) {
        perRoute[key] = (perRoute[key] ?? 0) + 1
        tried++
        const payload = new TextEncoder().encode(objectText([['fuzzUnknown', 'x'.repeat(size)]]))
        const stream = new ReadableStream<Uint8Array>({
          start(controller) {
            for (let i = 0; i < payload.length; i += 64 * 1024) controller.enqueue(payload.subarray(i, i + 64 * 1024))
            controller.close()
          },
        })
        let res: Response
        try {
          res = await fetch(BASE_URL + path, { method: route.method, headers: { 'cookie': owner, 'accept': 'application/json', 'content-type': 'application/json' }, body: stream, duplex: 'half' } as RequestInit)
        }
        catch (error) {
          // The server may close the socket after its 413 while the rest is still being sent.
          expect(name, String(error)).toBe('past 2 MB')
          continue
        }
        const text = await res.text()
        let json: any
        try { json = JSON.parse(text) }
        catch {}
        expectClear4xx(`${key} chunked ${name}`, { status: res.status, text, json })
        if (name === 'past 2 MB') expect(res.status).toBe(413)
      }
    }, 60_000)

    it('answers 4xx for deep nesting, bodies near and past 2 MB, and bytes that are not UTF-8', async () => {
      const path = realPath(route.path)
      const cases: [string, string | Buffer][] = [
        ['nested 64 deep', objectText([['fuzzUnknown', JSON.parse(deep(64))]])],
        ['nested 5000 deep', `{"fuzzUnknown":${deep(5000)}}`],
        ['nested 200 000 deep objects', `{"fuzzUnknown":1,"a":${deep(200_000, '{"a":', '}').replace('{"a":}', '1')}}`],
        ['just under 2 MB', objectText([['fuzzUnknown', 'x'.repeat(2 * MB - 40)]])],
        ['over 2 MB', objectText([['fuzzUnknown', 'x'.repeat(2 * MB + 10)]])],
        ['2 MB of escapes', objectText([['name', '\u0000'.repeat(Math.floor((2 * MB - 40) / 6))], ['fuzzUnknown', 1]])],
        ['invalid UTF-8', Buffer.from([0x7B, 0x22, 0x61, 0x22, 0x3A, 0x22, 0xFF, 0xFE, 0xC0, 0x80, 0x22, 0x7D])],
      ]
      for (const [name, raw] of cases) {
        perRoute[key] = (perRoute[key] ?? 0) + 1
        tried++
        const res = await fetch(BASE_URL + path, { method: route.method, headers: { 'cookie': owner, 'accept': 'application/json', 'content-type': 'application/json' }, body: typeof raw === 'string' ? raw : new Uint8Array(raw) })
        const text = await res.text()
        let json: any
        try { json = JSON.parse(text) }
        catch {}
        expectClear4xx(`${key} ${name}`, { status: res.status, text, json })
        if (name === 'over 2 MB') expect(res.status).toBe(413)
      }
    }, 60_000)
  })

  describe.each(queryRoutes.map(r => [r.key, r] as const))('query of %s', (key, route) => {
    it('answers 4xx for generated queries', async () => {
      const names = queryNames(route.source)
      const path = realPath(route.path)
      const query = fc.tuple(
        fc.tuple(...names.map(() => fc.array(badQueryValue, { minLength: 1, maxLength: 2 }))),
        fc.array(fc.tuple(fc.oneof(fieldKey, fc.constantFrom('a[b]', 'constructor[prototype][x]', '__proto__[role]')), badQueryValue), { maxLength: 3 }),
      ).map(([known, extra]) => [
        ...names.flatMap((n, i) => known[i]!.map(v => `${n}=${enc(v)}`)),
        ...extra.map(([k, v]) => `${enc(k)}=${enc(v)}`),
      ].join('&'))
      await fc.assert(fc.asyncProperty(query, async (q) => {
        perRoute[key] = (perRoute[key] ?? 0) + 1
        expectClear4xx(`${key} ?${q.slice(0, 120)}`, await send(route.method, `${path}?${q}`, route.method === 'GET' ? undefined : '{}'))
      }), { numRuns: RUNS, seed: SEED })
    })
  })

  describe.each(paramRoutes.map(r => [r.key, r] as const))('address of %s', (key, route) => {
    it('answers 4xx for ids that are no record', async () => {
      await fc.assert(fc.asyncProperty(badId, async (id) => {
        perRoute[key] = (perRoute[key] ?? 0) + 1
        const path = route.path.replace(/\[\w+\]/g, enc(id))
        expectClear4xx(`${key} ${path.slice(0, 120)}`, await send(route.method, path, route.method === 'GET' ? undefined : '{"fuzzUnknown":1}'))
      }), { numRuns: RUNS, seed: SEED })
    })
  })

  it('/api/sync refuses each poisoned event on its own, with a reason, and stores none of them', async () => {
    const me = (await call('GET', '/api/me', { cookie: owner })).body.user
    const event = fc.tuple(fc.constantFrom('note.added', 'value.recorded', 'hold.overridden', 'run.abandoned'), fc.oneof(loneSurrogate, hugeNumber))
      .map(([type, bad]) => ({
        id: uuidv7(), runId: ids.runs, type, at: new Date().toISOString(), actorId: me.id, deviceId: 'fuzz',
        ...(type === 'value.recorded' ? { stepKey: 'fuzz', unit: 'mm', value: typeof bad === 'number' ? bad : 1, reason: typeof bad === 'string' ? bad : undefined } : {}),
        ...(type === 'note.added' ? { text: typeof bad === 'string' ? bad : 'Fine text', extra: typeof bad === 'number' ? bad : undefined } : {}),
        ...(type === 'hold.overridden' ? { stepKey: 'fuzz', reason: typeof bad === 'string' ? `The guard was checked by hand ${bad}` : 'The guard was checked by hand twice.', weight: typeof bad === 'number' ? bad : undefined } : {}),
        ...(type === 'run.abandoned' ? { reason: typeof bad === 'string' ? `Stopped for the day ${bad}` : 'Stopped for the day.', size: typeof bad === 'number' ? bad : undefined } : {}),
      }))
    await fc.assert(fc.asyncProperty(fc.array(event, { minLength: 1, maxLength: 5 }), async (events) => {
      perRoute['POST /api/sync'] = (perRoute['POST /api/sync'] ?? 0) + 1
      tried++
      const res = await call('POST', '/api/sync', { cookie: owner, body: { deviceId: 'fuzz', events } })
      expect(res.status, res.text.slice(0, 300)).toBe(200)
      expect(res.body.accepted).toEqual([])
      expect(res.body.rejected.map((r: any) => r.id).sort()).toEqual(events.map(e => e.id).sort())
      for (const r of res.body.rejected) expect(r.reason.length).toBeGreaterThan(5)
    }), { numRuns: RUNS, seed: SEED })
  })

  it('left every table exactly as it was', async () => {
    expect(await snapshot()).toEqual(before)
  })
})
