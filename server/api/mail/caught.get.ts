// Owner, development only: the messages the local fake SMTP server caught for this shop. Off
// (404) unless NUXT_MAIL_FAKE_API_URL is set. The fake catches every shop's mail, so only
// messages whose Message-ID belongs to this shop's outbox are shown.
interface FakeMail {
  id: string, time: string, subject: string, text?: string
  to?: { address: string }[], from?: { address: string, name?: string }[], headers?: Record<string, string>
}

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const { fakeApiUrl } = mailSettings()
  if (!fakeApiUrl) throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No local fake mail server is in use.' })
  let caught: FakeMail[]
  try {
    const res = await fetch(`${fakeApiUrl}/api/email`, { signal: AbortSignal.timeout(5000) })
    if (!res.ok) throw new Error(`answered ${res.status}`)
    caught = await res.json() as FakeMail[]
  }
  catch (error) {
    console.error('[jogwise] caught mail:', error instanceof Error ? error.message : error)
    throw createError({ statusCode: 503, statusMessage: 'Service unavailable', message: 'The local fake mail server does not answer. Is it running (npm start starts it)?' })
  }
  // Message-IDs of this shop's sent mail
  const mine = await useDB().select({ messageId: tables.mailOutbox.messageId, kind: tables.mailOutbox.kind }).from(tables.mailOutbox)
    .where(and(eq(tables.mailOutbox.shopId, owner.shopId), isNotNull(tables.mailOutbox.messageId)))
  const kindById = new Map(mine.map(m => [m.messageId!, m.kind]))
  return caught
    .filter(m => kindById.has(m.headers?.['message-id'] ?? ''))
    .map(m => ({
      id: m.id, time: m.time, subject: m.subject, text: m.text ?? '',
      to: (m.to ?? []).map(t => t.address), messageId: m.headers!['message-id']!, kind: kindById.get(m.headers!['message-id']!)!,
    }))
    .sort((a, b) => b.time.localeCompare(a.time))
})
