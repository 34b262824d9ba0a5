import { Readable } from 'node:stream'
import { stringify } from 'csv-stringify'
import { LedgerExportSchema } from '#shared/schemas/ledger'
import { LEAD_ROLES } from '#shared/types/roles'

// The whole filtered Ledger as CSV (csv-stringify) for people (columns: ledgerCsvColumns), streamed: rows are read in keyset batches
// and written as the client takes them, so a shop with 200,000 entries never sits in memory.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...LEAD_ROLES)
  const { tz, ...filter } = queryValid(event, LedgerExportSchema)
  // The local-time column uses the browser's zone (the screen sends it), else the server's; the
  // headers and readable cells are in the caller's language.
  const columns = ledgerCsvColumns(tz ?? Intl.DateTimeFormat().resolvedOptions().timeZone, callerLanguage(event))
  const day = new Date().toISOString().slice(0, 10)
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="jogwise-ledger-${day}.csv"`,
    'cache-control': 'no-store',
  })
  async function* records() {
    for await (const row of ledgerAll(user.shopId, filter)) yield ledgerCsvRecord(row, columns)
  }
  const csv = stringify({ header: true, columns: columns.map(c => c.header) })
  const source = Readable.from(records())
  source.on('error', (err) => {
    // Headers are gone already; end the download broken rather than pretend it is complete.
    console.error('[jogwise] ledger export failed:', err)
    csv.destroy(err)
  })
  return sendStream(event, source.pipe(csv))
})
