import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { runInNewContext } from 'node:vm'
import request from 'supertest'
import type { Rollup } from 'vite'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { bundleEarlyScript, chunkFilesFor } from '../../build/inline-early-script'
import { createApp } from '../../server/app'
import { inlineScriptHashes } from '../../server/middleware/security'
import { createTestApp, type TestApp } from '../helpers/test-app'

describe('inline script hashes for the content security policy', () => {
  it('hashes the script text as CSP does', () => {
    // Reference: W3C, Content Security Policy Level 2 (2016), section 4.2.4 "Valid Hashes for
    // Scripts", example: <script>alert('Hello, world.');</script> is allowed by this source.
    // (Value recalled from memory; it is also what `openssl dgst -sha256 -binary | base64` gives.)
    expect(inlineScriptHashes("<script>alert('Hello, world.');</script>")).toEqual(["'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='"])
  })

  it('skips scripts loaded from a file and keeps every inline one, in order', () => {
    const html = '<head><script type="module" crossorigin src="/assets/index.js"></script><script>a()</script>\n<script id="x" defer src="/r.js"></script><SCRIPT>b()</SCRIPT></head>'
    const hashes = inlineScriptHashes(html)
    expect(hashes).toHaveLength(2)
    expect(hashes).toEqual([...inlineScriptHashes('<script>a()</script>'), ...inlineScriptHashes('<script>b()</script>')])
  })

  describe('served with the built page', () => {
    let t: TestApp
    beforeAll(async () => {
      t = await createTestApp()
    })
    afterAll(async () => {
      await t.close()
    })

    it("allows the page's inline script by its hash, on the page and on the API alike", async () => {
      const dist = mkdtempSync(join(tmpdir(), 'chalkline-dist-'))
      writeFileSync(join(dist, 'index.html'), "<!doctype html><html><head><title>x</title>\n<script>alert('Hello, world.');</script></head><body></body></html>")
      const app = createApp({ ...t.config, clientDist: dist }, { mailer: t.mailer })
      for (const path of ['/train', '/api/health']) {
        const csp = (await request(app).get(path)).headers['content-security-policy'] as string
        expect(csp, path).toContain("script-src 'self' 'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='")
      }
      // Without a built page, no inline script is allowed.
      expect((await request(t.app).get('/api/health')).headers['content-security-policy']).toMatch(/script-src 'self';/)
    })
  })
})

describe('the chunks the early script preloads', () => {
  const chunk = (fileName: string, moduleIds: string[], imports: string[], isEntry = false) =>
    ({ type: 'chunk', fileName, moduleIds, imports, isEntry }) as unknown as Rollup.OutputChunk
  const bundle = {
    a: chunk('assets/index-1.js', ['/src/main.ts'], ['assets/runtime-1.js'], true),
    b: chunk('assets/train.schema-1.js', ['/shared/schemas/train.schema.ts'], ['assets/runtime-1.js', 'assets/zod-1.js', 'assets/index-1.js']),
    c: chunk('assets/runtime-1.js', ['/runtime'], []),
    d: chunk('assets/zod-1.js', ['/zod'], ['assets/runtime-1.js']),
    e: { type: 'asset', fileName: 'assets/index-1.css' },
  } as unknown as Rollup.OutputBundle

  it("are the schema's chunk and everything it imports, once each, without the entry chunk", () => {
    expect(chunkFilesFor(bundle, '/shared/schemas/train.schema.ts', '/')).toEqual(['/assets/train.schema-1.js', '/assets/runtime-1.js', '/assets/zod-1.js'])
  })

  it('fail the build when the schema is in no chunk (a renamed file must not drop the preload quietly)', () => {
    expect(() => chunkFilesFor(bundle, '/shared/schemas/gone.schema.ts', '/')).toThrow(/no chunk holds/)
  })
})

describe('the inlined early script, as built', () => {
  /** Runs the bundled script against a pretend page: its storage, address, fetch and <head>. */
  async function runPage(path: string, storage: Record<string, string>) {
    const code = await bundleEarlyScript(undefined, ['/assets/train.schema-1.js', '/assets/zod-1.js'])
    const fetches: { url: string; init: { headers: Record<string, string> } }[] = []
    const links: { rel: string; href: string }[] = []
    const page: Record<string, unknown> = {
      location: { pathname: path },
      localStorage: { getItem: (key: string) => storage[key] ?? null },
      fetch: (url: string, init: { headers: Record<string, string> }) => {
        fetches.push({ url, init })
        return Promise.resolve({ ok: true })
      },
      document: {
        createElement: () => ({ rel: '', href: '' }),
        head: { appendChild: (link: { rel: string; href: string }) => links.push(link) },
      },
      URLSearchParams,
      Date,
      JSON,
    }
    page.globalThis = page
    runInNewContext(code, page)
    return { fetches, links, left: page.__chalklinePageTodayRequest as { date: string } | null }
  }

  const lifter = { 'chalkline.token': 'tok', 'chalkline.user': JSON.stringify({ id: 7, role: 'lifter' }) }

  it('sends today\'s request and preloads its schema chunks for a lifter opening Train', async () => {
    const { fetches, links, left } = await runPage('/train', lifter)
    expect(fetches).toHaveLength(1)
    expect(fetches[0]!.url).toMatch(/^\/api\/train\/today\?date=\d{4}-\d{2}-\d{2}&tzOffset=-?\d+$/)
    expect(fetches[0]!.init.headers).toEqual({ Accept: 'application/json', Authorization: 'Bearer tok' })
    expect(links).toEqual([{ rel: 'modulepreload', href: '/assets/train.schema-1.js' }, { rel: 'modulepreload', href: '/assets/zod-1.js' }])
    expect(left?.date).toBe(new URL(fetches[0]!.url, 'http://phone').searchParams.get('date'))
  })

  it('does nothing on another screen, signed out, or for a coach', async () => {
    for (const [path, storage] of [
      ['/sign-in', lifter],
      ['/train', {}],
      ['/train', { ...lifter, 'chalkline.user': JSON.stringify({ id: 2, role: 'coach' }) }],
    ] as const) {
      const { fetches, links, left } = await runPage(path, storage)
      expect(fetches, path).toHaveLength(0)
      expect(links).toHaveLength(0)
      expect(left).toBeNull()
    }
  })
})
