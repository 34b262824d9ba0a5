import { createServer, type Server } from 'node:net'
import { afterAll, describe, expect, it } from 'vitest'
import { nodeStream, parseDbHosts } from '../../../server/utils/db-nodes'

// The node list of NUXT_DB_HOST and the failover of new connections, against real sockets on
// loopback: one port with a listener, one with none (connection refused).

describe('parseDbHosts', () => {
  it('reads host and host:port entries with the default port', () => {
    expect(parseDbHosts('10.0.0.1:4411, db2 ,[::1]:3307', 3306)).toEqual([
      { host: '10.0.0.1', port: 4411 }, { host: 'db2', port: 3306 }, { host: '::1', port: 3307 },
    ])
    expect(parseDbHosts('', 3417)).toEqual([{ host: '127.0.0.1', port: 3417 }])
  })

  it('names a bad entry', () => {
    expect(() => parseDbHosts('db1:99999', 3306)).toThrow(/port 99999 of "db1:99999" is out of range/)
    expect(() => parseDbHosts('db1:x', 3306)).toThrow(/"db1:x" is not host or host:port/)
  })
})

describe('nodeStream', () => {
  const servers: Server[] = []
  afterAll(() => servers.forEach(s => s.close()))
  const listen = () => new Promise<number>((resolve) => {
    const s = createServer(c => c.end()).listen(0, '127.0.0.1', () => resolve((s.address() as { port: number }).port))
    servers.push(s)
  })
  const closedPort = async () => {
    const port = await listen()
    await new Promise(r => servers.pop()!.close(r))
    return port
  }

  it('stays on the first node while it answers, and moves on for good when it fails', async () => {
    const dead = await closedPort()
    const alive = await listen()
    const factory = nodeStream([{ host: '127.0.0.1', port: dead }, { host: '127.0.0.1', port: alive }])
    expect(factory.inUse().port).toBe(dead)
    const first = factory()
    await new Promise(r => first.once('error', r))
    expect(factory.inUse().port).toBe(alive)
    const second = factory()
    await new Promise(r => second.once('connect', r))
    expect(second.remotePort).toBe(alive)
    second.destroy()
  })
})
