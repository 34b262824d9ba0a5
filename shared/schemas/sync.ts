import { z } from 'zod'
import { MAX_SEAL_LENGTH } from '../runs/signoff-seal'
import { MAX_ID } from './input'
import { MAX_SYNC_EVENTS } from './sync-limits'

export { MAX_SYNC_EVENTS }

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)

/**
 * Body of POST /api/sync. Events are checked one by one by the server (one bad event must not
 * sink the batch), so here they are only required to be objects.
 */
export const SyncRequestSchema = z.object({
  deviceId: z.string({ error: 'deviceId must be text.' }).trim().min(1, 'deviceId is required.').max(64, 'deviceId must be at most 64 characters.'),
  since: z.number({ error: 'since must be a number.' }).int('since must be a whole number.').nonnegative('since must not be negative.').max(MAX_ID, 'since is beyond any stored event.').optional(),
  watch: z.array(z.uuid({ error: 'watch must list run ids (UUIDs).' }), { error: 'watch must be a list of run ids.' })
    .max(50, 'watch may list at most 50 runs.').optional(),
  // A plain test, not z.record: a record is copied key by key, 500 times a batch (issue 14).
  events: z.array(z.custom<Record<string, unknown>>(isPlainObject, { error: 'Each event must be an object.' }), { error: 'events must be a list.' })
    .max(MAX_SYNC_EVENTS, `Send at most ${MAX_SYNC_EVENTS} events per request.`),
}).strict()
export type SyncRequest = z.infer<typeof SyncRequestSchema>

export interface SyncRejection { id: string, reason: string }

/** An event as the server returns it: the event itself plus where it stands on the server. */
export type ServerEvent = Record<string, unknown> & {
  id: string
  runId: string
  type: string
  at: string
  actorId: number
  deviceId: string
  seq: number
  flag: string | null
}

export interface SyncResponse {
  accepted: string[]
  rejected: SyncRejection[]
  events: ServerEvent[]
  cursor: number
}

/**
 * Body of POST /api/runs/:id/signoff-check: a sealed sign-off (shared/runs/signoff-seal.ts), or,
 * from a page without WebCrypto (plain http), the claim itself for the server to check and seal.
 */
export const SignoffCheckSchema = z.object({
  seal: z.string({ error: 'seal must be the sealed signature (text).' }).min(1, 'seal is required.').max(MAX_SEAL_LENGTH, 'seal is too long.').optional(),
  claim: z.object({
    stepKey: z.string({ error: 'stepKey must be text.' }).min(1, 'stepKey must not be empty.').max(60, 'stepKey must be at most 60 characters.').nullable(),
    signerId: z.number({ error: 'Pick who is signing.' }).int('Pick who is signing.').positive('Pick who is signing.'),
    eventId: z.uuid({ error: 'eventId must be the sign-off event\'s id.' }),
    time: z.iso.datetime({ offset: true, error: 'time must be an ISO date and time.' }),
    pin: z.string({ error: 'A PIN is 4 to 8 digits.' }).regex(/^\d{4,8}$/, 'A PIN is 4 to 8 digits.').optional(),
    password: z.string({ error: 'Enter the password.' }).min(1, 'Enter the password.').max(200, 'That password is too long.').optional(),
  }, { error: 'claim must be an object.' }).strict().refine(c => (c.pin === undefined) !== (c.password === undefined), { path: ['pin'], message: 'Enter the PIN or the password of the person signing.' }).optional(),
}).strict().refine(b => (b.seal === undefined) !== (b.claim === undefined), { path: ['seal'], message: 'Send the sealed signature (seal) or, without WebCrypto, the claim.' })
