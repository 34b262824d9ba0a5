import { connect, type Socket } from 'node:net'

// Several database nodes for one app server (a Galera cluster): NUXT_DB_HOST may list them,
// comma-separated, each `host` or `host:port` (NUXT_DB_PORT is the default port), in this app
// server's order of preference. All new connections go to one node; when a connection to it
// fails or is cut, that node is left alone for a while and the next one in the list is used,
// and the app stays there (it does not move back by itself: a node that just came back may
// still be catching up). Writing through one node per app server also keeps Galera's
// certification conflicts rare; give each app server a different first node to spread load.

export interface DbNode { host: string, port: number }

/** `a:3306,b,c:3307` → nodes; an empty list is one node on 127.0.0.1. */
export function parseDbHosts(host: string, defaultPort: number): DbNode[] {
  const nodes = host.split(',').map(h => h.trim()).filter(Boolean).map((h) => {
    const m = /^(\[[^\]]+\]|[^:]+)(?::(\d{1,5}))?$/.exec(h)
    if (!m) throw new Error(`NUXT_DB_HOST: "${h}" is not host or host:port`)
    const port = m[2] ? Number(m[2]) : defaultPort
    if (!(port >= 1 && port <= 65535)) throw new Error(`NUXT_DB_HOST: port ${m[2]} of "${h}" is out of range`)
    return { host: m[1]!.replace(/^\[|\]$/g, ''), port }
  })
  return nodes.length ? nodes : [{ host: '127.0.0.1', port: defaultPort }]
}

const REST_MS = 10_000

/** mysql2's `stream` factory: a socket to the node in use, moving on when one fails. */
export function nodeStream(nodes: DbNode[], now = () => Date.now()) {
  let current = 0
  const restUntil = new Map<number, number>()
  const failed = (i: number) => {
    restUntil.set(i, now() + REST_MS)
    if (current !== i) return
    // The next node not resting; if all are, simply the next one
    for (let step = 1; step <= nodes.length; step++) {
      const j = (i + step) % nodes.length
      if ((restUntil.get(j) ?? 0) <= now() || step === nodes.length) { current = j; break }
    }
    console.warn(`[jogwise] database node ${nodes[i]!.host}:${nodes[i]!.port} failed; using ${nodes[current]!.host}:${nodes[current]!.port}`)
  }
  const factory = (): Socket => {
    const i = current
    const socket = connect(nodes[i]!.port, nodes[i]!.host)
    socket.setNoDelay(true)
    socket.setKeepAlive(true, 10_000)
    socket.once('error', () => failed(i))
    return socket
  }
  factory.inUse = () => nodes[current]!
  return factory
}
