import { describe, expect, it } from 'vitest'
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'

// House rule: shared/ is pure TypeScript, deterministic, relative imports only inside shared/.
const dir = join(__dirname, '../../shared/domain')
const files = readdirSync(dir).filter((f) => f.endsWith('.ts'))

describe('shared/domain stays pure', () => {
  it('imports nothing but zod (its mini build) and its own files', () => {
    expect(files.length).toBeGreaterThan(5)
    for (const f of files) {
      const imports = [...readFileSync(join(dir, f), 'utf8').matchAll(/from '([^']+)'/g)].map((m) => m[1])
      for (const spec of imports) expect(spec === 'zod/mini' || spec.startsWith('./'), `${f} imports ${spec}`).toBe(true)
    }
  })

  it('never reads the clock or randomness', () => {
    for (const f of files) {
      const src = readFileSync(join(dir, f), 'utf8')
      // new Date(value) only converts; new Date() and Date.now() read the clock.
      expect(/Date\.now|new Date\(\s*\)|Math\.random|performance\.now/.test(src), f).toBe(false)
    }
  })
})
