/**
 * Vite plugin: ship only the Vant icon glyphs the app can show.
 *
 * Vant's icon CSS (vant/es/icon/index.css) inlines its whole icon font (about 25 KB of woff2,
 * 34 KB as base64) plus about 260 `.van-icon-NAME:before{content:"\eXXX"}` rules, and names a
 * copy on a CDN as a fallback. At build time this plugin rewrites that file:
 *
 * - keeps the icons whose names appear as string literals in src/ (a `<van-button icon="plus">`,
 *   a `:icon="done ? 'success' : 'circle'"`, a `van-icon-...` class) and those drawn by the Vant
 *   components the app uses (`<van-cell>` -> cell/ and every vant/es module it imports, scanned
 *   for `name: "arrow"`, `makeStringProp("cross")`, `arrow-${direction}` ...);
 * - checks, once the bundle is made, that every Vant module in it was one of those scanned, and
 *   fails the build otherwise, so no Vant component can render a blank icon;
 * - subsets the font to those glyphs (subset-font, harfbuzz) and drops every other rule;
 * - always (dev too) removes the CDN fallback, so no request ever leaves our origin.
 *
 * The subset font stays inlined as a data: URI. It is a few KB, every screen with a Vant icon
 * needs it at once, and inlined it arrives with the CSS: no extra round trip on a slow gym
 * network and no moment of invisible icons while a font file loads. The CSS (so the font) is
 * counted in the page-weight budget rather than hidden among excluded font files, and the
 * service worker precaches it with the CSS (it would precache a separate .woff2 as well, so
 * offline use is the same either way). If the kept set ever grows near the full font, emitting
 * a .woff2 asset would be the better trade.
 *
 * Only `vite build` subsets: the dev server keeps the whole font, since it caches this
 * transform and would not see a new icon name until restarted. A name built at run time
 * (`'arrow-' + dir`) is invisible to the scan; write icon names as whole literals.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { dirname, join, relative, resolve } from 'node:path'
import subsetFont from 'subset-font'
import type { Plugin, ResolvedConfig } from 'vite'

/** `.van-icon-NAME:before{content:"\eXXX"}` as written in Vant's minified CSS. */
const ICON_RULE = /\.van-icon-([a-z0-9-]+):before\{content:"\\([0-9a-fA-F]{1,6})"\}/g
const ICON_RULE_COUNT = /\.van-icon-[a-z0-9-]+:before\{content:/g
const FONT_DATA_URI = /url\(data:font\/woff2;charset=utf-8;base64,([A-Za-z0-9+/=]+)\)/
const CDN_FALLBACK = /,\s*url\((?:https?:)?\/\/at\.alicdn\.com[^)]*\)\s*format\(["']woff["']\)/g
const VANT_CSS = /[\\/]vant[\\/](?:es|lib)[\\/].*\.css$/
const VANT_ICON_CSS = /[\\/]vant[\\/](?:es|lib)[\\/]icon[\\/]index\.css$/

/** Icon name -> code point, from the rules in Vant's icon CSS. */
export function parseIconRules(css: string): Map<string, number> {
  const icons = new Map<string, number>()
  for (const m of css.matchAll(ICON_RULE)) icons.set(m[1]!, Number.parseInt(m[2]!, 16))
  const written = css.match(ICON_RULE_COUNT)?.length ?? 0
  if (icons.size === 0 || icons.size !== written) {
    throw new Error(`vant-icon-subset: read ${icons.size} of ${written} icon rules; has Vant's icon CSS changed its format?`)
  }
  return icons
}

/**
 * Icon names written as literals in a source text: a quoted string that is exactly a known
 * name (any quote kind, nested quotes included, so both branches of `cond ? 'a' : 'b'` count),
 * a `van-icon-NAME` class, and the static head of a template literal (`arrow-${dir}` keeps
 * every `arrow-...` icon).
 */
export function iconNamesIn(text: string, known: ReadonlySet<string>): Set<string> {
  const found = new Set<string>()
  for (const m of text.matchAll(/(?<=["'`])([a-z0-9-]+)(?=["'`])/g)) if (known.has(m[1]!)) found.add(m[1]!)
  for (const m of text.matchAll(/van-icon-([a-z0-9-]+)/g)) if (known.has(m[1]!)) found.add(m[1]!)
  for (const m of text.matchAll(/(?<=`)([a-z0-9-]*-)\$\{/g)) {
    for (const name of known) if (name.startsWith(m[1]!)) found.add(name)
  }
  return found
}

function filesUnder(dir: string, wanted: RegExp): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter((f) => wanted.test(f))
    .map((f) => join(dir, f))
    .sort()
}

const kebab = (pascal: string) => pascal.replace(/([a-z0-9])([A-Z])/g, '$1-$2').toLowerCase()

/**
 * The Vant component folders (vant/es/<folder>) the app uses: `<van-button>` / `<VanButton>`
 * tags (the auto-import resolver's names), values imported from 'vant' (`showToast` lives in
 * toast/) and paths under vant/es/. Throws on a value from 'vant' it cannot place.
 */
export function vantComponentsUsedBy(sources: string[], vantDir: string): string[] {
  const folders = new Set<string>()
  const isFolder = (name: string) => existsSync(join(vantDir, name, 'index.mjs'))
  const values = new Set<string>()
  for (const text of sources) {
    for (const m of text.matchAll(/<van-([a-z0-9-]+)/g)) if (isFolder(m[1]!)) folders.add(m[1]!)
    for (const m of text.matchAll(/<Van([A-Z][A-Za-z0-9]*)/g)) if (isFolder(kebab(m[1]!))) folders.add(kebab(m[1]!))
    for (const m of text.matchAll(/["']vant\/(?:es|lib)\/([a-z0-9-]+)/g)) if (isFolder(m[1]!)) folders.add(m[1]!)
    for (const m of text.matchAll(/import\s*\{([^}]*)\}\s*from\s*["']vant["']/g)) {
      for (const spec of m[1]!.split(',')) {
        const name = spec.trim().split(/\s+as\s+/)[0]!.trim()
        if (name && !name.startsWith('type ')) values.add(name)
      }
    }
  }
  const indexes = readdirSync(vantDir)
    .filter(isFolder)
    .map((folder) => ({ folder, text: readFileSync(join(vantDir, folder, 'index.mjs'), 'utf8') }))
  for (const value of values) {
    const home = indexes.find(({ text }) => new RegExp(`\\b${value}\\b`).test(text))
    if (!home) throw new Error(`vant-icon-subset: cannot tell which Vant folder exports "${value}"`)
    folders.add(home.folder)
  }
  return [...folders].sort()
}

/** The .mjs files reachable from the given Vant folders' index.mjs through relative imports. */
export function vantModulesOf(folders: string[], vantDir: string): Set<string> {
  const seen = new Set<string>()
  const stack = folders.map((folder) => resolve(vantDir, folder, 'index.mjs'))
  while (stack.length) {
    const file = stack.pop()!
    if (seen.has(file)) continue
    seen.add(file)
    for (const m of readFileSync(file, 'utf8').matchAll(/(?:from|import)\s*["'](\.{1,2}\/[^"']+\.mjs)["']/g)) {
      stack.push(resolve(dirname(file), m[1]!))
    }
  }
  return seen
}

export interface IconUse {
  /** Names written in the app's own source (src/**\/*.{vue,ts}), with the files naming them. */
  app: Map<string, string[]>
  /** The Vant component folders the app uses. */
  components: string[]
  /** Every Vant module those components load (absolute paths). */
  vantModules: Set<string>
  /** Names those Vant modules can render, with the modules naming them. */
  vant: Map<string, string[]>
}

/** Scans the app's source and the Vant modules it uses for icon names known to the CSS. */
export function findUsedIcons(root: string, known: ReadonlySet<string>): IconUse {
  const vantDir = join(root, 'node_modules/vant/es')
  const add = (map: Map<string, string[]>, name: string, file: string) => map.set(name, [...(map.get(name) ?? []), relative(root, file)])
  const app = new Map<string, string[]>()
  const sources: string[] = []
  for (const file of filesUnder(join(root, 'src'), /\.(vue|ts)$/)) {
    const text = readFileSync(file, 'utf8')
    sources.push(text)
    for (const name of iconNamesIn(text, known)) add(app, name, file)
  }
  const components = vantComponentsUsedBy(sources, vantDir)
  const vantModules = vantModulesOf(components, vantDir)
  const vant = new Map<string, string[]>()
  for (const file of vantModules) for (const name of iconNamesIn(readFileSync(file, 'utf8'), known)) add(vant, name, file)
  return { app, components, vantModules, vant }
}

export function stripCdnFallback(css: string): string {
  return css.replace(CDN_FALLBACK, '')
}

export interface SubsetResult {
  css: string
  /** Kept icon names, sorted. */
  kept: string[]
  fontBytesBefore: number
  fontBytesAfter: number
}

/**
 * Vant's icon CSS with only the `keep` icons: their rules stay, all others go, and the inlined
 * woff2 is cut to their code points. Names not in the CSS are ignored.
 */
export async function subsetVantIconCss(css: string, keep: Iterable<string>): Promise<SubsetResult> {
  const icons = parseIconRules(css)
  const kept = [...new Set(keep)].filter((name) => icons.has(name)).sort()
  const dataUri = FONT_DATA_URI.exec(css)
  if (!dataUri) throw new Error("vant-icon-subset: no inlined woff2 in Vant's icon CSS")
  const font = Buffer.from(dataUri[1]!, 'base64')
  const text = [...new Set(kept.map((name) => icons.get(name)!))].map((cp) => String.fromCodePoint(cp)).join('')
  const subset = await subsetFont(font, text, { targetFormat: 'woff2' })
  const keptSet = new Set(kept)
  const out = stripCdnFallback(css)
    .replace(ICON_RULE, (rule, name: string) => (keptSet.has(name) ? rule : ''))
    .replace(FONT_DATA_URI, `url(data:font/woff2;charset=utf-8;base64,${subset.toString('base64')})`)
  return { css: out, kept, fontBytesBefore: font.length, fontBytesAfter: subset.length }
}

/** Every icon the app can show: named in src/ or rendered by a Vant component it uses. */
export function iconsToKeep(use: IconUse): string[] {
  return [...new Set([...use.app.keys(), ...use.vant.keys()])].sort()
}

const VANT_MODULE = /[\\/]node_modules[\\/]vant[\\/]es[\\/].+\.mjs$/

export function vantIconSubset(options: { root?: string } = {}): Plugin {
  let config: ResolvedConfig
  let cached: { source: string; use: IconUse; result: Promise<SubsetResult> } | undefined
  return {
    name: 'chalkline:vant-icon-subset',
    enforce: 'pre',
    configResolved(resolved) {
      config = resolved
    },
    async transform(code, id) {
      const path = id.split('?', 1)[0]!
      if (!VANT_CSS.test(path)) return null
      if (config.command !== 'build' || !VANT_ICON_CSS.test(path)) {
        return code.includes('alicdn.com') ? { code: stripCdnFallback(code), map: null } : null
      }
      if (cached?.source !== code) {
        const use = findUsedIcons(options.root ?? config.root, new Set(parseIconRules(code).keys()))
        cached = { source: code, use, result: subsetVantIconCss(code, iconsToKeep(use)) }
      }
      const result = await cached.result
      config.logger.info(
        `vant-icon-subset: kept ${result.kept.length} icons (${cached.use.components.length} Vant components scanned), ` +
          `font ${result.fontBytesBefore} -> ${result.fontBytesAfter} bytes`,
      )
      return { code: result.css, map: null }
    },
    // The kept set rests on a prediction of which Vant modules the app bundles; check it against
    // the bundle. A Vant module that was bundled but not scanned might render a dropped icon.
    generateBundle(_options, bundle) {
      if (!cached) return
      for (const output of Object.values(bundle)) {
        if (output.type !== 'chunk') continue
        for (const [id, module] of Object.entries(output.modules)) {
          const path = id.split('?', 1)[0]!
          if (module.renderedLength === 0 || !VANT_MODULE.test(path) || cached.use.vantModules.has(resolve(path))) continue
          this.error(
            `vant-icon-subset: ${relative(config.root, path)} is bundled but was not scanned for icon names; ` +
              "teach vantComponentsUsedBy how the app reaches it (build/vant-icon-subset.ts)",
          )
        }
      }
    },
  }
}
