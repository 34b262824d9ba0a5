import type { H3Event } from 'h3'

// Request bodies are counted as they arrive, whatever the client claims: a chunked body has no
// Content-Length, so a limit that only reads the header lets any size through and buffers it.

export const MAX_BODY_BYTES = 2 * 1024 * 1024
// Photos have their own 10 MB rule in the route; this only stops bodies far beyond it early.
export const MAX_UPLOAD_BODY_BYTES = 11 * 1024 * 1024

const RAW_BODY = Symbol.for('h3RawBody')

export function bodyLimitFor(event: H3Event) {
  return event.method === 'PUT' && event.path.startsWith('/api/uploads/') ? MAX_UPLOAD_BODY_BYTES : MAX_BODY_BYTES
}

export function tooLarge(limit: number) {
  return createError({ statusCode: 413, statusMessage: 'Payload too large', message: `The request body is over ${limit / 1024 / 1024} MB.` })
}

export function hasBody(event: H3Event) {
  const headers = event.node.req.headers
  return Number.parseInt(headers['content-length'] || '') > 0 || headers['transfer-encoding'] !== undefined
}

/**
 * Reads the whole body, refusing it with a 413 as soon as it passes `limit` bytes. What is read
 * is handed to h3 (readBody / readRawBody use it), so routes need not know. Past the limit the
 * rest is read and dropped, never kept, so the client still gets to read the 413.
 */
export function readBodyWithin(event: H3Event, limit: number): Promise<Buffer> {
  const req = event.node.req
  const declared = Number.parseInt(req.headers['content-length'] || '')
  if (declared > limit) return Promise.reject(tooLarge(limit))
  const body = new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size <= limit) { chunks.push(chunk); return }
      chunks.length = 0
      req.off('data', onData)
      // Keep the socket flowing; the rest of the bytes are dropped as they come.
      req.resume()
      reject(tooLarge(limit))
    }
    req.on('data', onData)
    req.once('end', () => resolve(Buffer.concat(chunks)))
    req.once('error', reject)
  })
  ;(req as unknown as Record<symbol, unknown>)[RAW_BODY] = body
  return body
}
