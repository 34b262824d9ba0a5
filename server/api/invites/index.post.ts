import { InviteCreateSchema } from '#shared/schemas/invite'

// The owner invites someone by e-mail: the invite row and its mail are written together. The
// mail is in the language the owner chose for it, else the owner's own. (Never the language of
// an account elsewhere: the outbox shows the owner the subject, and it must not tell them.)
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValid(event, InviteCreateSchema)
  if (body.language !== undefined && !isLanguage(body.language)) {
    throw invalidInput('language', `Jogwise has no ${body.language} screens; choose one of ${LANGUAGES.join(', ')}.`)
  }
  const db = useDB()
  const taken409 = (message: string) => conflict(`email: ${message}`, [{ path: 'email', message }])

  // Is the e-mail address already someone's sign-in, and in which shop?
  const [taken] = await db.select({ shopId: tables.users.shopId }).from(tables.users).where(eq(tables.users.email, body.email)).limit(1)
  if (taken?.shopId === owner.shopId) throw taken409('Someone in your crew already signs in with that e-mail address.')
  // Another shop's address gets the same answer as a new one (an owner must not learn who uses
  // Jogwise elsewhere); its mail tells the address's owner instead, without a link.
  const elsewhere = !!taken
  const lang = body.language ?? callerLanguage(event)
  const m = (key: string, values: Record<string, string | number> = {}) => messageIn(lang, `mail.invite.${key}`, values)
  // A pending invite of this shop for the same address
  const [pending] = await db.select({ id: tables.invites.id }).from(tables.invites).where(and(
    eq(tables.invites.shopId, owner.shopId), eq(tables.invites.email, body.email),
    isNull(tables.invites.acceptedAt), isNull(tables.invites.revokedAt), gt(tables.invites.expiresAt, new Date()),
  )).limit(1)
  if (pending) throw taken409('That address already has a pending invite. Withdraw it first to send a new one.')

  const { token, hash } = newInviteToken()
  const expiresAt = new Date(Date.now() + mailSettings().inviteTtlHours * 3600_000)
  // The shop's name, for the mail
  const [shop] = await db.select({ name: tables.shops.name }).from(tables.shops).where(eq(tables.shops.id, owner.shopId)).limit(1)
  const id = await withWriteRetry(() => db.transaction(async (tx) => {
    const [{ id }] = await tx.insert(tables.invites).values({
      shopId: owner.shopId, email: body.email, role: body.role, tokenHash: hash, invitedBy: owner.id, expiresAt,
    }).$returningId() as [{ id: number }]
    const shopName = shop?.name ?? m('aShop')
    const subject = m('subject', { name: owner.name, shop: shopName })
    if (elsewhere) {
      await enqueueMail(tx, {
        shopId: owner.shopId, kind: 'invite', dedupeKey: `invite:${id}`, to: body.email, subject,
        text: [m('triedIntro', { name: owner.name, shop: shopName }), m('taken'), m('takenWhat')].join('\n\n'),
      })
      await recordAudit(tx, owner, 'invite.sent', 'invite', id, { email: body.email, role: body.role })
      return id
    }
    await enqueueMail(tx, {
      shopId: owner.shopId, kind: 'invite', dedupeKey: `invite:${id}`, to: body.email, subject,
      text: [
        m('intro', { name: owner.name, shop: shopName, role: messageIn(lang, `mail.role.${body.role}`) }),
        // The link itself is sealed beside the row and put in only as the mail is sent; the join
        // screen opens in the mail's language.
        `${m('openLink')}\n${INVITE_LINK_PLACEHOLDER}?lang=${lang}`,
        m('until', { when: expiresAt.toISOString().replace('T', ' ').slice(0, 16) }),
        m('ignore'),
      ].join('\n\n'),
      linkSecret: sealInviteToken(token),
    })
    await recordAudit(tx, owner, 'invite.sent', 'invite', id, { email: body.email, role: body.role })
    return id
  }))
  setResponseStatus(event, 201)
  return { id, email: body.email, role: body.role, status: 'pending' as const, expiresAt: expiresAt.toISOString() }
})
