import { InviteAcceptSchema } from '#shared/schemas/invite'

// Public: accepting an invite creates the person and signs them in. The invite row is locked
// for the whole transaction, so two clicks on the same link make one person, and the second
// one answers 410.
export default defineEventHandler(async (event) => {
  const body = await readValid(event, InviteAcceptSchema)
  if (body.language !== undefined && !isLanguage(body.language)) {
    throw invalidInput('language', `Jogwise has no ${body.language} screens; choose one of ${LANGUAGES.join(', ')}.`)
  }
  const language = body.language ?? null
  const passwordHash = await hashPassword(body.password)
  const user = await withWriteRetry(() => useDB().transaction(async (tx) => {
    // The invite with this token's hash, locked
    const [invite] = await tx.select().from(tables.invites)
      .where(eq(tables.invites.tokenHash, hashInviteToken(body.token))).limit(1).for('update')
    assertInviteUsable(invite, invite && await inviterOf(tx, invite.invitedBy))
    const inv = invite!
    // Has the address become someone's sign-in since the invite was sent?
    const [taken] = await tx.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, inv.email)).limit(1)
    if (taken) throw conflict('Someone already signs in with this e-mail address. Sign in instead, or ask the owner.')
    const [{ id }] = await tx.insert(tables.users).values({
      shopId: inv.shopId, email: inv.email, name: body.name, role: inv.role, passwordHash, language,
    }).$returningId() as [{ id: number }]
    await tx.update(tables.invites).set({ acceptedAt: new Date(), acceptedUserId: id }).where(eq(tables.invites.id, inv.id))
    await tx.insert(tables.auditEntries).values({
      shopId: inv.shopId, actorId: id, kind: 'invite.accepted', subjectType: 'invite', subjectId: String(inv.id),
      detail: { userId: id, role: inv.role, email: inv.email },
    })
    return { id, shopId: inv.shopId, name: body.name, email: inv.email, role: inv.role, language }
  }))
  await setUserSession(event, { user, loggedInAt: Date.now() })
  setResponseStatus(event, 201)
  return { user }
})
