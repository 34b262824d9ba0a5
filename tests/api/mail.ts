import { db } from './client'

// What the fake SMTP server (maildev, from npm) caught, read through its own REST API: maildev
// parses the SMTP message itself, so these checks see the mail as a receiver would.
export const MAIL_API = process.env.JOGWISE_MAIL_API_URL || 'http://127.0.0.1:3428'

export interface CaughtMail {
  id: string, subject: string, text: string, html?: string
  to: { address: string }[], headers: Record<string, string>
}

export async function caughtMail(api = MAIL_API): Promise<CaughtMail[]> {
  const res = await fetch(`${api}/api/email`)
  if (!res.ok) throw new Error(`the fake mail server answered ${res.status}`)
  return await res.json() as CaughtMail[]
}

export const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))

/** Waits until `check` returns something truthy, or fails after `ms`. */
export async function until<T>(what: string, check: () => Promise<T | undefined | null | false>, ms = 20_000): Promise<T> {
  const end = Date.now() + ms
  for (;;) {
    const v = await check()
    if (v) return v
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`)
    await sleep(250)
  }
}

export async function outboxRow(dedupeKey: string) {
  const [[row]] = await db().query<any[]>('select * from mail_outbox where dedupe_key = ?', [dedupeKey])
  return row as { id: number, status: string, attempts: number, last_error: string | null, message_id: string | null, to_address: string, subject: string, text_body: string } | undefined
}

/** The outbox row with this key once sent, and the mail the fake caught for it. */
export async function deliveredMail(dedupeKey: string, ms = 20_000) {
  const row = await until(`outbox row ${dedupeKey} to be sent`, async () => {
    const r = await outboxRow(dedupeKey)
    return r?.status === 'sent' ? r : undefined
  }, ms)
  const mail = await until(`the fake to hold ${row.message_id}`, async () =>
    (await caughtMail()).find(m => m.headers['message-id'] === row.message_id), ms)
  return { row, mail }
}

/** The link to the join page in an invite mail, and its token. */
export function inviteLink(text: string) {
  const m = text.match(/(https?:\/\/\S+\/join\/([\w-]+))/)
  if (!m) throw new Error(`no invite link in: ${text}`)
  return { url: m[1]!, token: m[2]! }
}
