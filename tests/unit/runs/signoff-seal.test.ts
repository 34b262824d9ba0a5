import { webcrypto } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import {
  bindingProblem, fromBase64url, newNonce, openSeal, SEAL_EVENT_SKEW_MS, SEAL_LIFETIME_MS, sealClaim, toBase64url, type SealClaim, type SealKey,
} from '../../../shared/runs/signoff-seal'
import { foldRun } from '../../../shared/runs/fold'
import { ledgerEntriesOf } from '../../../shared/runs/ledger'
import { ev, GUIDED_HAPPY, script, STEPS, TRAINEE, TRAINER } from './fixtures'

// Sealed sign-offs (issue 11, issue 18 High 1): the tablet encrypts the signer's PIN with what
// it signs to the server's RSA-OAEP public key; only the server opens it and checks the binding.
// Round trips use Node's WebCrypto (the same W3C Web Cryptography API the browser has).

const RSA = { name: 'RSA-OAEP', hash: 'SHA-256' } as const
async function keyPair(keyId = 'k1') {
  const pair = await webcrypto.subtle.generateKey({ ...RSA, modulusLength: 2048, publicExponent: new Uint8Array([1, 0, 1]) }, true, ['wrapKey', 'unwrapKey'])
  const spki = toBase64url(new Uint8Array(await webcrypto.subtle.exportKey('spki', pair.publicKey)))
  return { publicKey: { keyId, spki } satisfies SealKey, privateKey: pair.privateKey as CryptoKey }
}

const RUN = '0190c0de-0000-7000-8000-000000000001'
const EVENT = '0190c0de-0000-7000-8000-000000000002'
const AT = '2026-03-01T08:00:00.000Z'
const claim = (over: Partial<SealClaim> = {}): SealClaim => ({ runId: RUN, stepKey: 'isolate', signerId: 3, eventId: EVENT, nonce: 'AAAAAAAAAAAAAAAAAAAAAA', time: AT, pin: '2468', ...over })
const target = { runId: RUN, stepKey: 'isolate', signerId: 3, eventId: EVENT, at: AT }

describe('sealing and opening', () => {
  it('the server opens what the tablet sealed, and the seal does not contain the PIN in the clear', async () => {
    const k = await keyPair()
    const seal = await sealClaim(k.publicKey, claim())
    expect(seal).not.toContain('2468')
    expect(seal.length).toBeLessThan(2400)
    const opened = await openSeal(k.privateKey, 'k1', seal)
    expect(opened).toEqual({ ok: true, claim: claim() })
  })

  it('another key cannot open it, and a changed byte or key id is refused', async () => {
    const k = await keyPair()
    const other = await keyPair()
    const seal = await sealClaim(k.publicKey, claim())
    expect((await openSeal(other.privateKey, 'k1', seal)).ok).toBe(false)
    expect(await openSeal(k.privateKey, 'k2', seal)).toEqual({ ok: false, reason: 'The signature was sealed for another server key.' })
    const parts = seal.split('.')
    const body = fromBase64url(parts[4]!)
    body[0] = body[0]! ^ 1
    parts[4] = toBase64url(body)
    expect((await openSeal(k.privateKey, 'k1', parts.join('.'))).ok).toBe(false)
    expect((await openSeal(k.privateKey, 'k1', 'not a seal')).ok).toBe(false)
    expect((await openSeal(k.privateKey, 'k1', 42)).ok).toBe(false)
  })

  it('nonces are 16 random bytes and differ', () => {
    const a = newNonce()
    expect(fromBase64url(a)).toHaveLength(16)
    expect(newNonce()).not.toBe(a)
  })
})

describe('binding', () => {
  const now = Date.parse(AT) + 60_000
  it('accepts the event it was made for', () => {
    expect(bindingProblem(claim(), target, now)).toBeNull()
  })
  it('refuses another step, event, run, signer or the whole run', () => {
    expect(bindingProblem(claim(), { ...target, stepKey: 'final' }, now)).toMatch(/given for step "isolate"/)
    expect(bindingProblem(claim(), { ...target, eventId: '0190c0de-0000-7000-8000-000000000009' }, now)).toMatch(/another sign-off/)
    expect(bindingProblem(claim(), { ...target, runId: '0190c0de-0000-7000-8000-000000000008' }, now)).toMatch(/another run/)
    expect(bindingProblem(claim(), { ...target, signerId: 4 }, now)).toMatch(/not from the person/)
    expect(bindingProblem(claim({ stepKey: null }), target, now)).toMatch(/whole run/)
  })
  it('refuses a seal made apart from its event, and an expired one', () => {
    const late = new Date(Date.parse(AT) + SEAL_EVENT_SKEW_MS + 1000).toISOString()
    expect(bindingProblem(claim(), { ...target, at: late }, now)).toMatch(/not made together/)
    expect(bindingProblem(claim(), target, Date.parse(AT) + SEAL_LIFETIME_MS + 1)).toMatch(/expired/)
    expect(bindingProblem(claim(), target, Date.parse(AT) + SEAL_LIFETIME_MS - 1)).toBeNull()
  })
})

describe('the fold and the Ledger with server verdicts', () => {
  it('a sealed sign-off counts while awaiting check, and shows verified once the server says so', () => {
    const events = script('guided', GUIDED_HAPPY)
    const i = events.findIndex(e => e.type === 'signoff.given')
    const sealed = { ...events[i]!, seal: 'js1.k.x.y.z' } as typeof events[number]
    const awaiting = foldRun(STEPS, events.map((e, n) => (n === i ? sealed : e)))
    expect(awaiting.signoffs[0]!.check).toBe('awaiting')
    expect(awaiting.status).toBe('finished')
    const verified = foldRun(STEPS, events.map((e, n) => (n === i ? { ...events[i]!, verdict: { status: 'verified' } } as typeof e : e)))
    expect(verified.signoffs.map(s => s.check)).toEqual(['verified', 'verified'])
  })

  it('a sign-off refused at merge is flagged, does not count, and is a signoff-failed Ledger entry', () => {
    const events = script('guided', GUIDED_HAPPY)
    const i = events.findIndex(e => e.type === 'signoff.given')
    const reason = 'The sign-off by Tess failed its check: That PIN is not Tess\'s.'
    const failed = events.map((e, n) => (n === i ? { ...e, verdict: { status: 'refused', code: 'signoff-failed', reason } } as typeof e : e))
    const s = foldRun(STEPS, failed)
    expect(s.flagged.map(f => [f.code, f.event.id])).toContainEqual(['signoff-failed', events[i]!.id])
    expect(s.status).toBe('active')
    expect(s.steps.find(x => x.key === 'isolate')!.status).toBe('acknowledged')
    // Work after the unsigned hold did not count either (fold rule: holds block what follows).
    expect(s.flagged.some(f => f.code === 'passed-unsigned-hold')).toBe(true)
    const entries = ledgerEntriesOf(s, STEPS).filter(e => e.kind === 'signoff-failed')
    expect(entries).toEqual([{ eventId: events[i]!.id, kind: 'signoff-failed', actorId: TRAINER, stepKey: 'isolate', at: events[i]!.at, counted: true, detail: { stepTitle: 'Isolate the power', signerId: TRAINER, signerRole: 'trainer', reason } }])
  })

  it('an event refused for its actor is kept on the record, flagged, and not counted', () => {
    const start = ev('run.started', { procedureVersionId: 7, machineId: 2, mode: 'solo' }, { actor: TRAINER, sec: 0 })
    const intro = { ...ev('step.done', { stepKey: 'intro' }, { actor: TRAINEE, sec: 1 }), verdict: { status: 'refused', code: 'actor-not-allowed', reason: 'A trainee may not act in a solo run.' } } as ReturnType<typeof ev>
    const s = foldRun(STEPS, [start, intro])
    expect(s.steps[0]!.status).toBe('pending')
    expect(s.flagged.map(f => [f.code, f.message])).toEqual([['actor-not-allowed', 'A trainee may not act in a solo run.']])
  })

  it('a hand-over is on the record', () => {
    const start = ev('run.started', { procedureVersionId: 7, machineId: 2, mode: 'guided' }, { actor: TRAINEE, sec: 0 })
    const s = foldRun(STEPS, [start, ev('run.handed-over', { toUserId: 5 }, { actor: TRAINEE, sec: 1 })])
    expect(s.handovers.map(h => [h.actorId, h.toUserId])).toEqual([[TRAINEE, 5]])
    expect(s.flagged).toEqual([])
  })
})
