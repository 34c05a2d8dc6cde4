/** Starts and stops the built Tidewright server (.output) as a child process. */
import { spawn, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { createServer } from 'node:net'

export interface RunningServer {
  baseURL: string
  process: ChildProcess
  output: () => string
  stop: () => Promise<void>
}

/** A port the OS reports free right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer()
    probe.unref()
    probe.on('error', reject)
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address()
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))))
    })
  })
}

async function waitForHealth(baseURL: string, child: ChildProcess, log: () => string, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`Server exited with ${child.exitCode}:\n${log()}`)
    try {
      const response = await fetch(`${baseURL}/health`)
      if (response.ok) return
    }
    catch { /* not listening yet */ }
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  throw new Error(`Server did not become healthy in ${timeoutMs} ms:\n${log()}`)
}

/** Starts `node .output/server/index.mjs` on a free port against the given database file; `nodeArgs` go to node before the script (a profiler's flags, which NODE_OPTIONS refuses). */
export async function startServer(options: { dbPath: string, port?: number, env?: Record<string, string>, nodeArgs?: readonly string[] }): Promise<RunningServer> {
  const port = options.port ?? await freePort()
  const baseURL = `http://127.0.0.1:${port}`
  let log = ''
  const child = spawn(process.execPath, [...options.nodeArgs ?? [], '.output/server/index.mjs'], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      NUXT_DB_PATH: options.dbPath,
      NUXT_SESSION_PASSWORD: randomBytes(32).toString('hex'),
      ...options.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout?.on('data', (chunk) => { log += chunk })
  child.stderr?.on('data', (chunk) => { log += chunk })
  await waitForHealth(baseURL, child, () => log)
  return {
    baseURL,
    process: child,
    output: () => log,
    stop: () => new Promise((resolve) => {
      if (child.exitCode !== null) return resolve()
      child.once('exit', () => resolve())
      child.kill('SIGTERM')
    }),
  }
}
