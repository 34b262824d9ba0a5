// Owner: the state of this shop's outgoing mail (waiting with its tries and last error, or sent),
// and whether the local fake mail server's page is available.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  // The shop's newest outbox rows
  const items = await useDB().select({
    id: tables.mailOutbox.id, kind: tables.mailOutbox.kind, to: tables.mailOutbox.toAddress, subject: tables.mailOutbox.subject,
    status: tables.mailOutbox.status, attempts: tables.mailOutbox.attempts, nextAttemptAt: tables.mailOutbox.nextAttemptAt,
    lastError: tables.mailOutbox.lastError, messageId: tables.mailOutbox.messageId, sentAt: tables.mailOutbox.sentAt, createdAt: tables.mailOutbox.createdAt,
  }).from(tables.mailOutbox).where(eq(tables.mailOutbox.shopId, owner.shopId))
    .orderBy(desc(tables.mailOutbox.id)).limit(100)
  return { fakeInUse: !!mailSettings().fakeApiUrl, items }
})
