import { spawn, type ChildProcess } from 'node:child_process'
import { createServer } from 'node:net'

// The built app once more, on a free loopback port with extra settings, for checks that need a
// server configured differently from the suite's (e.g. behind a trusted proxy).
export const SERVER_ENTRY = process.env.JOGWISE_SERVER_ENTRY || '.data/test-output/server/index.mjs'

export function freePort() {
  return new Promise<number>((resolve, reject) => {
    const probe = createServer().once('error', reject).listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as { port: number }
      probe.close(() => resolve(port))
    })
  })
}

export interface AppServer { url: string, pid: number, log: () => string, stop: () => Promise<void> }

export async function startApp(env: Record<string, string>): Promise<AppServer> {
  const port = await freePort()
  const url = `http://127.0.0.1:${port}`
  let output = ''
  const child: ChildProcess = spawn(process.execPath, [SERVER_ENTRY], {
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', NUXT_DEMO_SEED: '', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout!.on('data', d => (output += d))
  child.stderr!.on('data', d => (output += d))
  const server: AppServer = {
    url,
    pid: child.pid!,
    log: () => output,
    stop: () => new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve()
      child.once('exit', () => resolve())
      child.kill('SIGTERM')
    }),
  }
  for (let i = 0; i < 160; i++) {
    try { if ((await fetch(`${url}/api/health`)).ok) return server }
    catch {}
    await new Promise(r => setTimeout(r, 250))
  }
  await server.stop()
  throw new Error(`the app server did not start:\n${output}`)
}
