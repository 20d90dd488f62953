import { spawn } from 'node:child_process'
import { freePort } from '../helpers/server-process'

export interface BaselineProcess {
  url: string
  stop: () => Promise<void>
}

/**
 * A baseline server of the API benchmark (bare-server.mjs, floor-server.ts) in a process of its
 * own, like the real server: `node <args>` from the repository root with PORT set to a free
 * loopback port; ready when it prints its first line, stopped with SIGTERM.
 */
export async function startBaselineProcess(root: string, args: string[], env: Record<string, string> = {}): Promise<BaselineProcess> {
  const port = await freePort()
  const child = spawn(process.execPath, args, {
    cwd: root,
    env: { ...process.env, ...env, PORT: String(port) },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  const stop = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return
    const exited = new Promise((r) => child.once('exit', r))
    child.kill('SIGTERM')
    await exited
  }
  await new Promise<void>((resolve, reject) => {
    child.stdout!.once('data', () => resolve())
    child.once('exit', (code) => reject(new Error(`${args.join(' ')} exited with ${code}`)))
  })
  return { url: `http://127.0.0.1:${port}`, stop }
}
