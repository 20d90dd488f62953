import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { freePort } from '../helpers/server-process'

/**
 * The README's quick start, run as a newcomer runs it: `npm start` in a checkout with no `data/`
 * and no `dist/`, and no environment variable but the port (so it cannot collide with another
 * server on this machine). The checkout is a copy of this one's files (tracked and new, as git
 * lists them) with node_modules copied, so the build here never touches the dist/ that the other
 * browser tests serve.
 */
const root = resolve(import.meta.dirname, '../..')
let checkout: string
let child: ChildProcess
let baseUrl: string
let output = ''

function copyCheckout(): string {
  const dir = mkdtempSync(join(tmpdir(), 'chalkline-start-'))
  const listed = spawnSync('git', ['ls-files', '-z', '--cached', '--others', '--exclude-standard'], { cwd: root, encoding: 'utf8' })
  if (listed.status !== 0) throw new Error(`git ls-files failed: ${listed.stderr}`)
  for (const file of listed.stdout.split('\0').filter(Boolean)) {
    if (!existsSync(join(root, file))) continue // deleted in the working tree
    mkdirSync(dirname(join(dir, file)), { recursive: true })
    cpSync(join(root, file), join(dir, file))
  }
  // node_modules as an installed copy, not a link, so every path resolves inside the checkout as
  // after `npm install`. Hard links make that copy instant; across file systems it is a real copy.
  const linked = spawnSync('cp', ['-al', join(root, 'node_modules'), join(dir, 'node_modules')])
  if (linked.status !== 0) cpSync(join(root, 'node_modules'), join(dir, 'node_modules'), { recursive: true, verbatimSymlinks: true })
  return dir
}

/** The environment a newcomer's shell has: nothing the test runner set, and no NODE_ENV. */
function newcomerEnv(port: number): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {}
  for (const [key, value] of Object.entries(process.env)) {
    if (key === 'NODE_ENV' || key.startsWith('VITEST') || key.startsWith('VITE_') || key.startsWith('npm_')) continue
    if (key === 'TEST' || key === 'CHALKLINE_DIST') continue
    env[key] = value
  }
  env.PORT = String(port)
  return env
}

beforeAll(async () => {
  checkout = copyCheckout()
  expect(existsSync(join(checkout, 'data'))).toBe(false)
  expect(existsSync(join(checkout, 'dist'))).toBe(false)
  const port = await freePort()
  baseUrl = `http://127.0.0.1:${port}`
  // `detached` gives npm, its shell and the server a process group of their own to stop together.
  child = spawn('npm', ['start'], { cwd: checkout, env: newcomerEnv(port), detached: true, stdio: ['ignore', 'pipe', 'pipe'] })
  child.stdout?.on('data', (d) => (output += d))
  child.stderr?.on('data', (d) => (output += d))
  const deadline = Date.now() + 170_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`npm start exited with ${child.exitCode}:\n${output}`)
    try {
      if ((await fetch(`${baseUrl}/api/health`)).ok) break
    } catch {
      // still building, or not listening yet
    }
    if (Date.now() > deadline) throw new Error(`npm start did not answer /api/health within 170 s:\n${output}`)
    await new Promise((r) => setTimeout(r, 500))
  }
}, 180_000)

afterAll(async () => {
  if (child?.pid && child.exitCode === null) {
    const exited = new Promise((r) => child.once('exit', r))
    process.kill(-child.pid, 'SIGTERM')
    await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))])
    if (child.exitCode === null) process.kill(-child.pid, 'SIGKILL')
  }
  if (checkout) rmSync(checkout, { recursive: true, force: true })
})

describe('npm start, exactly as the README says', () => {
  it('serves the built app at / and at a deep link such as /train', async () => {
    for (const path of ['/', '/train']) {
      const res = await fetch(baseUrl + path)
      expect(res.status, path).toBe(200)
      expect(res.headers.get('content-type'), path).toMatch(/text\/html/)
      const html = await res.text()
      expect(html, path).toContain('<title>Chalkline</title>')
      expect(html, path).toMatch(/<script type="module"[^>]*src="\/assets\//)
    }
    // The production server says so at start-up.
    expect(output).toMatch(/Chalkline production server/)
  })

  it('answers the API health check', async () => {
    const res = await fetch(`${baseUrl}/api/health`)
    expect(res.status).toBe(200)
    expect(await res.json()).toEqual({ ok: true })
  })

  it('loads the demo club into the new data folder: the demo lifter can sign in', async () => {
    expect(readdirSync(join(checkout, 'data'))).toContain('chalkline.sqlite')
    const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: DEMO_ACCOUNTS.lifterKg.email, password: DEMO_PASSWORD }),
    })
    expect(res.status).toBe(200)
    const body = (await res.json()) as { user: { email: string; role: string } }
    expect(body.user).toMatchObject({ email: DEMO_ACCOUNTS.lifterKg.email, role: 'lifter' })
  })
})
