import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.unref()
    srv.on('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const address = srv.address()
      srv.close(() => resolve(typeof address === 'object' && address ? address.port : 0))
    })
  })
}

/**
 * Starts the built production server (dist/server/index.js, made by `npm run build`) on a free
 * loopback port over a fresh database that loads the demo club on first start.
 */
export async function startBuiltServer(env: Record<string, string> = {}, options: { dir?: string } = {}) {
  // Reusing a folder restarts the server over the same database (as after a crash).
  const dir = options.dir ?? mkdtempSync(join(tmpdir(), 'chalkline-e2e-'))
  const port = await freePort()
  // CHALKLINE_DIST: a build kept apart from dist/ (e.g. /tmp/x with x/server and x/client).
  const dist = process.env.CHALKLINE_DIST
  const child: ChildProcess = spawn(process.execPath, [`${dist ?? 'dist'}/server/index.js`], {
    env: {
      ...process.env,
      ...(dist ? { CLIENT_DIST: `${dist}/client` } : {}),
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATABASE_PATH: join(dir, 'e2e.sqlite'),
      BCRYPT_COST: '10',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  child.stdout?.on('data', (d) => (output += d))
  child.stderr?.on('data', (d) => (output += d))
  const baseUrl = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 60_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`)
    try {
      const res = await fetch(`${baseUrl}/api/health`)
      if (res.ok) break
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`server did not start within 60 s:\n${output}`)
    await new Promise((r) => setTimeout(r, 200))
  }
  async function stop({ keepData = false } = {}) {
    if (child.exitCode === null && child.signalCode === null) {
      const exited = new Promise((r) => child.once('exit', r))
      child.kill('SIGTERM')
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))])
      if (child.exitCode === null) child.kill('SIGKILL')
    }
    if (!keepData) rmSync(dir, { recursive: true, force: true })
  }
  /** Kills the process at once, as a power cut would: no shutdown, no flush. */
  async function kill() {
    const exited = new Promise((r) => child.once('exit', r))
    child.kill('SIGKILL')
    await exited
  }
  return { baseUrl, port, dir, stop, kill, output: () => output }
}
