import { spawn, type ChildProcess } from 'node:child_process'
import { getRandomPort } from 'get-port-please'
import waitOn from 'wait-on'

// The built app once more, on a free loopback port with extra settings, for checks that need a
// server configured differently from the suite's (e.g. behind a trusted proxy).
export const SERVER_ENTRY = process.env.JOGWISE_SERVER_ENTRY || '.data/test-output/server/index.mjs'

/** A loopback port nothing listens on (get-port-please asks the system for one). */
export const freePort = () => getRandomPort('127.0.0.1')

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
  // Ready when /api/health answers 2xx (wait-on polls it).
  try {
    await waitOn({ resources: [`http-get://127.0.0.1:${port}/api/health`], timeout: 40_000, interval: 250, httpTimeout: 5000 })
    return server
  }
  catch {
    await server.stop()
    throw new Error(`the app server did not start:\n${output}`)
  }
}
