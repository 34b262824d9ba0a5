import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'
import type { DB, Tx } from './db'

// Every e-mail goes through the mail_outbox table: the code that causes a mail only inserts a
// row (in its own transaction, so the mail exists exactly when what caused it does), and the
// worker in server/plugins/mail-outbox.ts sends it over SMTP with retries.

export interface MailInput {
  shopId: number | null
  kind: string
  /** "Send this once": a second enqueue with the same key is quietly a no-op. */
  dedupeKey: string
  to: string
  subject: string
  text: string
  html?: string | null
  /** A sealed invite token: the link goes into the text only when the mail is sent. */
  linkSecret?: string | null
}

// MEDIUMTEXT holds 16 MB; a mail anywhere near that is a mistake to stop, not to cut short.
const MAX_MAIL_BYTES = 8 * 1024 * 1024

/**
 * Queues one mail; a duplicate dedupe key is not an error. Returns true when a row was added.
 * Anything else the database refuses is an error: no INSERT IGNORE, which would store a body
 * cut short with only a warning.
 */
export async function enqueueMail(db: DB | Tx, mail: MailInput): Promise<boolean> {
  const bytes = Buffer.byteLength(mail.text) + Buffer.byteLength(mail.html ?? '')
  if (bytes > MAX_MAIL_BYTES) throw new Error(`The ${mail.kind} mail ${mail.dedupeKey} is ${bytes} bytes, over the outbox's ${MAX_MAIL_BYTES}.`)
  // A new row; the dedupe key already there means it was queued before
  try {
    await db.insert(tables.mailOutbox).values({
      shopId: mail.shopId,
      kind: mail.kind,
      dedupeKey: mail.dedupeKey.slice(0, 160),
      toAddress: mail.to,
      subject: mail.subject.slice(0, 200),
      textBody: mail.text,
      htmlBody: mail.html ?? null,
      linkSecret: mail.linkSecret ?? null,
      // Set here rather than by the database so "due" is judged on one clock (the app's).
      nextAttemptAt: new Date(),
    })
    return true
  }
  catch (error) {
    if (duplicateKey(error, 'mail_outbox_dedupe_unique')) return false
    throw error
  }
}

export interface MailSettings {
  host: string
  port: number
  secure: boolean
  user: string
  pass: string
  from: string
  fakeApiUrl: string
  workerIntervalMs: number
  retryBaseMs: number
  retryCapMs: number
  digestHour: number
  inviteTtlHours: number
}

const num = (v: unknown, fallback: number) => {
  const n = Number(v)
  return v === '' || v === undefined || v === null || !Number.isFinite(n) ? fallback : n
}

/** Mail settings from runtime config (NUXT_MAIL_*), with the defaults filled in. */
export function mailSettings(): MailSettings {
  const m = useRuntimeConfig().mail
  return {
    host: String(m.smtpHost ?? ''),
    port: num(m.smtpPort, 587),
    secure: String(m.smtpSecure) === 'true',
    user: String(m.smtpUser ?? ''),
    pass: String(m.smtpPass ?? ''),
    from: String(m.from || 'Jogwise <no-reply@jogwise.invalid>'),
    fakeApiUrl: String(m.fakeApiUrl ?? '').replace(/\/+$/, ''),
    workerIntervalMs: Math.max(200, num(m.workerIntervalMs, 5000)),
    retryBaseMs: Math.max(100, num(m.retryBaseMs, 10_000)),
    retryCapMs: Math.max(100, num(m.retryCapMs, 15 * 60_000)),
    digestHour: Math.min(23, Math.max(0, Math.trunc(num(m.digestHour, 6)))),
    inviteTtlHours: Math.max(1, num(m.inviteTtlHours, 72)),
  }
}

/** The address people open links at; the scripts set NUXT_SITE_URL. */
export function siteUrl(): string {
  const configured = String(useRuntimeConfig().siteUrl ?? '').replace(/\/+$/, '')
  return configured || `http://localhost:${process.env.PORT || 3000}`
}

/** The Message-ID of an outbox row: the same on every retry, so a receiver can drop a copy. */
export function outboxMessageId(id: number): string {
  let host = 'jogwise.local'
  try { host = new URL(siteUrl()).hostname || host }
  catch {}
  return `<jogwise-outbox-${id}@${host}>`
}

/**
 * Wait before the next try after `attempts` failed tries: doubling from the base, never more
 * than the cap. There is no last try: a mail server that is down for a day must still get the
 * override alert afterwards, and the owner sees the waiting mail and its error on the mail page.
 */
export function retryDelayMs(attempts: number, s: Pick<MailSettings, 'retryBaseMs' | 'retryCapMs'>): number {
  const exp = Math.min(30, Math.max(0, attempts - 1))
  return Math.min(s.retryCapMs, s.retryBaseMs * 2 ** exp)
}

let transport: { key: string, t: Transporter } | undefined
function smtp(s: MailSettings): Transporter {
  const key = JSON.stringify([s.host, s.port, s.secure, s.user, s.pass])
  if (!transport || transport.key !== key) {
    transport?.t.close()
    transport = {
      key,
      t: nodemailer.createTransport({
        host: s.host, port: s.port, secure: s.secure,
        ...(s.user && { auth: { user: s.user, pass: s.pass } }),
        // Fail fast so one dead server does not hold the worker for minutes.
        connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000,
      }),
    }
  }
  return transport.t
}

export function closeMailTransport() {
  transport?.t.close()
  transport = undefined
}

// A claimed row is not due again for this long: if the process dies mid-send, another process
// retries it then (with the same Message-ID).
const CLAIM_LEASE_MS = 2 * 60_000
const BATCH = 20

/**
 * Sends the due mails once. A row is claimed with a conditional UPDATE (still waiting and
 * due), so when two app processes look at the same row only one of them gets affectedRows 1.
 */
export async function sendDueMail(now = new Date()): Promise<{ sent: number, failed: number }> {
  const s = mailSettings()
  const db = useDB()
  // Waiting rows whose time has come, oldest first
  const due = await db.select({ id: tables.mailOutbox.id }).from(tables.mailOutbox)
    .where(and(eq(tables.mailOutbox.status, 'waiting'), lte(tables.mailOutbox.nextAttemptAt, now)))
    .orderBy(asc(tables.mailOutbox.nextAttemptAt)).limit(BATCH)
  let sent = 0
  let failed = 0
  for (const { id } of due) {
    // Claim: count the try and push the row out of reach of the other processes
    const [claim] = await db.update(tables.mailOutbox).set({
      attempts: sql`${tables.mailOutbox.attempts} + 1`,
      nextAttemptAt: new Date(Date.now() + CLAIM_LEASE_MS),
    }).where(and(eq(tables.mailOutbox.id, id), eq(tables.mailOutbox.status, 'waiting'), lte(tables.mailOutbox.nextAttemptAt, now))) as unknown as [{ affectedRows: number }]
    if (claim.affectedRows !== 1) continue
    // The claimed row
    const [row] = await db.select().from(tables.mailOutbox).where(eq(tables.mailOutbox.id, id)).limit(1)
    if (!row) continue
    const messageId = outboxMessageId(row.id)
    try {
      if (!s.host) throw new Error('No SMTP server is set (NUXT_MAIL_SMTP_HOST).')
      const token = row.linkSecret ? openInviteToken(row.linkSecret) : null
      if (row.linkSecret && !token) throw new Error('The invite link cannot be opened with this server\'s secret; withdraw the invite and send a new one.')
      const text = token ? row.textBody.replace(INVITE_LINK_PLACEHOLDER, inviteLink(token)) : row.textBody
      await smtp(s).sendMail({
        from: s.from, to: row.toAddress, subject: row.subject, text,
        ...(row.htmlBody && { html: row.htmlBody }),
        messageId,
        headers: { 'X-Jogwise-Kind': row.kind },
      })
      // Sent: the sealed token is no longer needed
      await db.update(tables.mailOutbox).set({ status: 'sent', sentAt: new Date(), messageId, lastError: null, linkSecret: null })
        .where(eq(tables.mailOutbox.id, id))
      sent++
    }
    catch (error) {
      const reason = (error instanceof Error ? error.message : String(error)).slice(0, 500)
      // Failed this time: keep the reason and try again later
      await db.update(tables.mailOutbox).set({
        lastError: reason,
        nextAttemptAt: new Date(Date.now() + retryDelayMs(row.attempts, s)),
      }).where(and(eq(tables.mailOutbox.id, id), eq(tables.mailOutbox.status, 'waiting')))
      failed++
    }
  }
  return { sent, failed }
}

export async function activeOwners(db: DB | Tx, shopId: number) {
  // The shop's active owners
  return db.select({ id: tables.users.id, name: tables.users.name, email: tables.users.email, language: tables.users.language })
    .from(tables.users)
    .where(and(eq(tables.users.shopId, shopId), eq(tables.users.role, 'owner'), eq(tables.users.active, true)))
}

/** Escapes text for the HTML part of a mail. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' }[c]!))
}
