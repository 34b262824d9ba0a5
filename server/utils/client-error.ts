// The raw HTTP answer for a request Node's parser refused (see server/entry/node-server.ts).
// Same JSON shape as h3's errors, so clients read `message` the same way.

const TOO_LARGE = new Set(['HPE_HEADER_OVERFLOW'])

export function clientErrorAnswer(error: NodeJS.ErrnoException): string | null {
  // The client went away: nobody to answer.
  if (error.code === 'ECONNRESET' || error.code === 'EPIPE') return null
  const tooLarge = TOO_LARGE.has(String(error.code))
  const timeout = error.code === 'ERR_HTTP_REQUEST_TIMEOUT'
  const statusCode = tooLarge ? 431 : timeout ? 408 : 400
  const statusMessage = tooLarge ? 'Request Header Fields Too Large' : timeout ? 'Request Timeout' : 'Bad Request'
  const message = tooLarge
    ? 'The request\'s address or headers are too long (over 16 KB together); shorten the address or its query.'
    : timeout
      ? 'The request took too long to arrive.'
      : 'The request is not well-formed HTTP.'
  const body = JSON.stringify({ error: true, url: '', statusCode, statusMessage, message })
  return [
    `HTTP/1.1 ${statusCode} ${statusMessage}`,
    'Content-Type: application/json',
    `Content-Length: ${Buffer.byteLength(body)}`,
    'Cache-Control: no-store',
    'X-Content-Type-Options: nosniff',
    'Connection: close',
    '',
    body,
  ].join('\r\n')
}
