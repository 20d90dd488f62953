import { spawn, type ChildProcess } from 'node:child_process'
import { openSync, readFileSync, closeSync } from 'node:fs'
import { join } from 'node:path'
import { freePort } from '../helpers/server-process'

export interface ProductionServer {
  baseUrl: string
  pid: number
  /** Milliseconds from spawning `node dist/server/index.js` to the first 200 from /api/health. */
  startMs: number
  /** Resident memory of the server process in MB, read from /proc (Linux). */
  rssMb: () => number
  stop: () => Promise<void>
}

/**
 * The production server from the build, as `npm start` runs it after building, over the given
 * database file. Its request log goes to a file (as a real deployment's would go somewhere), so
 * logging costs what it costs in production without a pipe to drain.
 */
export async function startProductionServer(
  distDir: string,
  databasePath: string,
  logPath: string,
  env: Record<string, string> = {},
): Promise<ProductionServer> {
  const port = await freePort()
  const logFd = openSync(logPath, 'a')
  const started = performance.now()
  const child: ChildProcess = spawn(process.execPath, [join(distDir, 'server', 'index.js')], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATABASE_PATH: databasePath,
      CLIENT_DIST: join(distDir, 'client'),
      ...env,
    },
    stdio: ['ignore', logFd, logFd],
  })
  closeSync(logFd)
  const baseUrl = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 120_000
  let startMs = 0
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${readFileSync(logPath, 'utf8').slice(-2000)}`)
    try {
      const res = await fetch(`${baseUrl}/api/health`)
      if (res.ok) {
        startMs = performance.now() - started
        break
      }
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error('server did not start within 120 s')
    await new Promise((r) => setTimeout(r, 10))
  }
  const pid = child.pid!
  return {
    baseUrl,
    pid,
    startMs,
    rssMb() {
      const status = readFileSync(`/proc/${pid}/status`, 'utf8')
      const kb = Number(/VmRSS:\s+(\d+)\s+kB/.exec(status)?.[1] ?? NaN)
      return kb / 1024
    },
    async stop() {
      if (child.exitCode !== null || child.signalCode !== null) return
      const exited = new Promise((r) => child.once('exit', r))
      child.kill('SIGTERM')
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))])
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL')
    },
  }
}
