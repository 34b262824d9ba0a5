// The production server: Nitro's own node-server entry (nitropack presets/node/runtime/
// node-server), plus one thing it lacks. A request Node refuses before any route sees it (an
// address or headers over Node's 16 KB limit, a malformed request line) otherwise gets a bare
// status line with no body; here it gets a JSON answer with a message, like every other refusal.
import '#nitro-internal-pollyfills'
import { Server as HttpServer } from 'node:http'
import { Server as HttpsServer } from 'node:https'
import type { Duplex } from 'node:stream'
import destr from 'destr'
import { toNodeListener } from 'h3'
import { useNitroApp, useRuntimeConfig } from 'nitropack/runtime'
import { setupGracefulShutdown, trapUnhandledNodeErrors } from 'nitropack/runtime/internal'
import { clientErrorAnswer } from '../utils/client-error'

const cert = process.env.NITRO_SSL_CERT
const key = process.env.NITRO_SSL_KEY
const nitroApp = useNitroApp()
const server = cert && key ? new HttpsServer({ key, cert }, toNodeListener(nitroApp.h3App)) : new HttpServer(toNodeListener(nitroApp.h3App))

server.on('clientError', (error: NodeJS.ErrnoException, socket: Duplex) => {
  const answer = clientErrorAnswer(error)
  if (!answer || !socket.writable) {
    socket.destroy()
    return
  }
  socket.end(answer)
})

const _port = destr<number | string | undefined>(process.env.NITRO_PORT || process.env.PORT)
const port = _port === 0 ? 0 : _port || 3000
const host = process.env.NITRO_HOST || process.env.HOST
const path = process.env.NITRO_UNIX_SOCKET
const listener = server.listen(path ? { path } : { port: Number(port), host }, () => {
  const protocol = cert && key ? 'https' : 'http'
  const addressInfo = listener.address()
  if (typeof addressInfo === 'string' || !addressInfo) {
    console.log(`Listening on unix socket ${addressInfo}`)
    return
  }
  const baseURL = (useRuntimeConfig().app.baseURL || '').replace(/\/$/, '')
  console.log(`Listening on ${protocol}://${addressInfo.family === 'IPv6' ? `[${addressInfo.address}]` : addressInfo.address}:${addressInfo.port}${baseURL}`)
})
trapUnhandledNodeErrors()
setupGracefulShutdown(listener, nitroApp)

export default {}
