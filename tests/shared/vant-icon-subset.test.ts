/**
 * The build plugin that cuts Vant's inlined icon font to the icons the app can show
 * (build/vant-icon-subset.ts), run on the real vant/es/icon/index.css and the real src/.
 *
 * The subset font is decoded (fontverter: woff2 -> sfnt) and its character map read with
 * HarfBuzz (harfbuzzjs, `Face.collectUnicodes`), so "the glyph is there" is read from the font
 * itself, not from what the plugin says it kept.
 */
import { readdirSync, readFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { convert } from 'fontverter'
import { Blob as HbBlob, Face } from 'harfbuzzjs'
import type { Plugin, ResolvedConfig } from 'vite'
import {
  findUsedIcons,
  iconNamesIn,
  iconsToKeep,
  parseIconRules,
  subsetVantIconCss,
  vantIconSubset,
} from '../../build/vant-icon-subset'

const root = resolve(import.meta.dirname, '../..')
const ICON_CSS_PATH = join(root, 'node_modules/vant/es/icon/index.css')
const iconCss = readFileSync(ICON_CSS_PATH, 'utf8')
const icons = parseIconRules(iconCss)
const known = new Set(icons.keys())

function inlinedFont(css: string): Buffer {
  const m = /url\(data:font\/woff2;charset=utf-8;base64,([A-Za-z0-9+/=]+)\)/.exec(css)
  if (!m) throw new Error('no inlined woff2')
  return Buffer.from(m[1]!, 'base64')
}

async function codePointsOf(woff2: Buffer): Promise<Set<number>> {
  const sfnt = await convert(woff2, 'sfnt')
  return new Set(new Face(new HbBlob(new Uint8Array(sfnt))).collectUnicodes())
}

const hasRule = (css: string, name: string) =>
  new RegExp(`\\.van-icon-${name}:before\\{content:"\\\\${icons.get(name)!.toString(16)}"\\}`).test(css)

/** A second, plainer reading of src/, independent of the plugin's scanner: `icon="name"` and `<van-icon name="name">`. */
function iconAttributesInSrc(): Set<string> {
  const names = new Set<string>()
  for (const file of readdirSync(join(root, 'src'), { recursive: true, encoding: 'utf8' })) {
    if (!/\.(vue|ts)$/.test(file)) continue
    const text = readFileSync(join(root, 'src', file), 'utf8')
    for (const m of text.matchAll(/\bicon="([a-z0-9-]+)"/g)) names.add(m[1]!)
    for (const m of text.matchAll(/<van-icon[^>]*\sname="([a-z0-9-]+)"/g)) names.add(m[1]!)
  }
  return names
}

describe('iconNamesIn', () => {
  it('finds names in attributes, both branches of a condition, classes and template heads', () => {
    const text = [
      `<van-button icon="plus" aria-label="Don't">`,
      `<van-cell :icon="done ? 'success' : 'circle'" />`,
      `<i class="van-icon van-icon-fire-o"></i>`,
      'const name = `arrow-${direction}`',
      `const notAnIcon = 'pluses'; // plus in prose is not a literal`,
    ].join('\n')
    const found = iconNamesIn(text, known)
    expect([...found].sort()).toEqual(
      ['arrow-double-left', 'arrow-double-right', 'arrow-down', 'arrow-left', 'arrow-up', 'circle', 'fire-o', 'plus', 'success'].sort(),
    )
  })
})

describe('Vant icon subset on the real CSS and src/', async () => {
  const use = findUsedIcons(root, known)
  const kept = iconsToKeep(use)
  const result = await subsetVantIconCss(iconCss, kept)
  const fontCodePoints = await codePointsOf(inlinedFont(result.css))

  it('keeps every icon name written in src/, with its rule and its glyph', () => {
    const attributes = iconAttributesInSrc()
    expect(attributes.size).toBeGreaterThan(5)
    for (const name of attributes) expect(use.app.has(name), name).toBe(true)

    expect(use.app.size).toBeGreaterThan(0)
    for (const name of use.app.keys()) {
      expect(hasRule(result.css, name), `rule for ${name}`).toBe(true)
      expect(fontCodePoints.has(icons.get(name)!), `glyph for ${name}`).toBe(true)
    }
  })

  it("keeps the icons Vant's own components draw for the components the app uses", () => {
    // Read in Vant 4.10's ES build: cell/Cell.mjs draws "arrow" for is-link cells,
    // popup/Popup.mjs a "cross" close icon (closeIcon default), checkbox via checkbox/Checker.mjs
    // a "success" tick, field/Field.mjs a "clear" icon (clearIcon default).
    expect(use.components).toEqual(expect.arrayContaining(['cell', 'popup', 'checkbox', 'field']))
    for (const name of ['arrow', 'cross', 'success', 'clear']) {
      expect(use.vant.has(name), name).toBe(true)
      expect(hasRule(result.css, name), `rule for ${name}`).toBe(true)
      expect(fontCodePoints.has(icons.get(name)!), `glyph for ${name}`).toBe(true)
    }
  })

  it('drops the icons nobody can show: their rules and their glyphs', () => {
    // "wechat" is drawn only by share-sheet/ShareSheet.mjs, a component the app does not use.
    expect(use.components).not.toContain('share-sheet')
    expect(kept).not.toContain('wechat')
    expect(hasRule(iconCss, 'wechat')).toBe(true)
    expect(hasRule(result.css, 'wechat')).toBe(false)
    expect(fontCodePoints.has(icons.get('wechat')!)).toBe(false)

    const keptCodePoints = new Set(kept.map((name) => icons.get(name)!))
    expect([...fontCodePoints].filter((cp) => cp >= 0xe000).sort()).toEqual([...keptCodePoints].sort())
    for (const [name, cp] of icons) if (!kept.includes(name)) expect(hasRule(result.css, name), name).toBe(false)
    expect(parseIconRules(result.css).size).toBe(kept.length)
  })

  it('is much smaller, and names no CDN copy', () => {
    expect(kept.length).toBeLessThan(icons.size / 3)
    expect(result.fontBytesAfter).toBeLessThan(result.fontBytesBefore / 4)
    expect(result.css.length).toBeLessThan(iconCss.length / 3)
    expect(iconCss).toContain('alicdn.com')
    expect(result.css).not.toContain('alicdn.com')
    expect(result.css).toContain('.van-icon__image{')
  })
})

describe('vantIconSubset plugin', () => {
  type Hook = (this: unknown, ...args: unknown[]) => unknown
  const call = (plugin: Plugin, name: 'configResolved' | 'transform' | 'generateBundle', ctx: unknown, ...args: unknown[]) => {
    const hook = plugin[name] as Hook | { handler: Hook }
    return (typeof hook === 'function' ? hook : hook.handler).call(ctx, ...args)
  }
  const setUp = (command: 'build' | 'serve') => {
    const plugin = vantIconSubset({ root })
    call(plugin, 'configResolved', {}, { command, root, logger: { info() {} } } as unknown as ResolvedConfig)
    return plugin
  }
  const errors = { error: (message: string) => { throw new Error(message) } }
  const bundleWith = (moduleId: string) => ({
    'assets/x.js': { type: 'chunk', modules: { [moduleId]: { renderedLength: 100 } } },
  })

  it('subsets on build and refuses a bundled Vant module it did not scan', async () => {
    const plugin = setUp('build')
    const out = (await call(plugin, 'transform', {}, iconCss, ICON_CSS_PATH)) as { code: string }
    expect(out.code.length).toBeLessThan(iconCss.length / 3)
    expect(() => call(plugin, 'generateBundle', errors, {}, bundleWith(join(root, 'node_modules/vant/es/cell/Cell.mjs')))).not.toThrow()
    expect(() => call(plugin, 'generateBundle', errors, {}, bundleWith(join(root, 'node_modules/vant/es/share-sheet/ShareSheet.mjs')))).toThrow(
      /share-sheet\/ShareSheet\.mjs is bundled but was not scanned/,
    )
  })

  it('in dev only removes the CDN copy and keeps the whole font', async () => {
    const plugin = setUp('serve')
    const out = (await call(plugin, 'transform', {}, iconCss, ICON_CSS_PATH)) as { code: string }
    expect(out.code).not.toContain('alicdn.com')
    expect(parseIconRules(out.code).size).toBe(icons.size)
    expect(inlinedFont(out.code).equals(inlinedFont(iconCss))).toBe(true)
  })
})
