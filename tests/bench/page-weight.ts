/**
 * Benchmark part 1, page weight: what a signed-in lifter's phone downloads to open /train, and
 * the whole build, read from the Vite build output (dist/client/.vite/manifest.json).
 *
 * The Train route's first load is what index.html loads (its entry chunk, that chunk's static
 * imports and their CSS, which hold the app shell and its tab bar) plus the lazily loaded
 * TrainView chunk with its static imports and their CSS; Vite preloads exactly these when the
 * router opens the route. Chunks the start-up code imports dynamically on first use (the API
 * client's response schemas) are fetched on that first visit too and count; only other route
 * screens (src/views/) are left out. Each file is compressed on its own, as a server does: gzip level 9 and
 * brotli quality 11 (node:zlib). Fonts are listed apart and left out of the budget (issue 9);
 * a font inlined into CSS as a data: URI is CSS and counts.
 *
 * Also checked: chart.js, the plan editor and the coach screens are not in that first load.
 *
 * Alone, on an existing build: `npx tsx tests/bench/page-weight.ts [distDir]` (default dist/).
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs'
import { availableParallelism, tmpdir } from 'node:os'
import { dirname, join, posix, relative, resolve } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { brotliCompressSync, constants as zlibConstants, gzipSync } from 'node:zlib'
import { budget, type BenchContext, type BenchPart, type Budget } from './bench-types'

/** One entry of Vite's build manifest (https://vite.dev/guide/backend-integration). */
interface ManifestChunk {
  file: string
  src?: string
  name?: string
  isEntry?: boolean
  isDynamicEntry?: boolean
  imports?: string[]
  dynamicImports?: string[]
  css?: string[]
  assets?: string[]
}
type Manifest = Record<string, ManifestChunk>

export interface Size {
  files: number
  raw: number
  gzip: number
  brotli: number
}

const KB = 1000
/** Issue 9: the Train route's first load, fonts excluded. */
const BUDGET_FIRST_LOAD_JS_GZIP_KB = 120
const BUDGET_FIRST_LOAD_CSS_GZIP_KB = 20

const TRAIN_VIEW = 'src/views/TrainView.vue'
/** Screens that must stay in their own lazy chunks, out of the Train first load. */
const LAZY_SCREENS: { what: string; src: string }[] = [
  { what: 'Plan editor', src: 'src/views/PlanEditView.vue' },
  { what: 'Coach: athletes', src: 'src/views/AthletesView.vue' },
  { what: 'Coach: athlete page', src: 'src/views/AthleteDetailView.vue' },
  { what: 'Coach: review desk', src: 'src/views/ReviewDeskView.vue' },
  { what: 'Coach: session review', src: 'src/views/SessionReviewView.vue' },
  { what: 'Coach: plans', src: 'src/views/PlansView.vue' },
  { what: 'Chart: estimated 1RM', src: 'src/components/progress/ProgressE1rmChart.vue' },
  { what: 'Chart: weekly sets', src: 'src/components/progress/ProgressWeeklySetsChart.vue' },
  { what: 'Chart: body weight', src: 'src/components/progress/ProgressBodyWeightChart.vue' },
]
/**
 * chart.js is bundled into a shared chunk with no source path in the manifest; this message
 * from its date adapter stub (chart.js 4, src/core/core.adapters.ts) survives minification.
 */
const CHART_JS_MARKER = 'Check that a complete date adapter is provided'

const FONT_EXT = /\.(woff2?|ttf|otf|eot)$/
type Kind = 'js' | 'css' | 'font' | 'other'

function kindOf(file: string): Kind {
  if (/\.m?js$/.test(file)) return 'js'
  if (file.endsWith('.css')) return 'css'
  if (FONT_EXT.test(file)) return 'font'
  return 'other'
}

const sizeCache = new Map<string, Omit<Size, 'files'>>()

/** Raw, gzip (level 9) and brotli (quality 11) bytes of one file. */
export function fileSize(path: string): Omit<Size, 'files'> {
  const hit = sizeCache.get(path)
  if (hit) return hit
  const buf = readFileSync(path)
  const size = {
    raw: buf.length,
    gzip: gzipSync(buf, { level: 9 }).length,
    brotli: brotliCompressSync(buf, {
      params: {
        [zlibConstants.BROTLI_PARAM_QUALITY]: 11,
        [zlibConstants.BROTLI_PARAM_SIZE_HINT]: buf.length,
        [zlibConstants.BROTLI_PARAM_MODE]: kindOf(path) === 'font' ? zlibConstants.BROTLI_MODE_FONT : zlibConstants.BROTLI_MODE_TEXT,
      },
    }).length,
  }
  sizeCache.set(path, size)
  return size
}

function sumSizes(clientDir: string, files: Iterable<string>): Size {
  const total: Size = { files: 0, raw: 0, gzip: 0, brotli: 0 }
  for (const file of files) {
    const s = fileSize(join(clientDir, file))
    total.files++
    total.raw += s.raw
    total.gzip += s.gzip
    total.brotli += s.brotli
  }
  return total
}

/** Manifest keys reachable from `start` through static imports (the chunks themselves included). */
export function staticClosure(manifest: Manifest, start: string[]): Set<string> {
  const seen = new Set<string>()
  const stack = [...start]
  while (stack.length) {
    const key = stack.pop()!
    if (seen.has(key)) continue
    if (!manifest[key]) throw new Error(`page-weight: "${key}" is not in the build manifest`)
    seen.add(key)
    stack.push(...(manifest[key].imports ?? []))
  }
  return seen
}

/**
 * Chunks that code in `loaded` imports dynamically, other than route screens (src/views/) and
 * chunks already loaded, with their static imports: what start-up code fetches on first use.
 */
export function onFirstUse(manifest: Manifest, loaded: Set<string>): Set<string> {
  const extra = new Set<string>()
  for (const key of loaded) {
    for (const dynamic of manifest[key]!.dynamicImports ?? []) {
      if (loaded.has(dynamic) || manifest[dynamic]?.src?.startsWith('src/views/') || dynamic.startsWith('src/views/')) continue
      for (const k of staticClosure(manifest, [dynamic])) if (!loaded.has(k)) extra.add(k)
    }
  }
  return extra
}

/** Local files an HTML page loads: scripts, stylesheets, preloads, icons and the web manifest. */
function filesLinkedBy(html: string): string[] {
  const refs = [...html.matchAll(/<(?:script|link)\b[^>]*?\b(?:src|href)="([^"]+)"/g)].map((m) => m[1]!)
  return refs.filter((ref) => ref.startsWith('/') && !ref.startsWith('//')).map((ref) => ref.slice(1).split(/[?#]/, 1)[0]!)
}

/**
 * Font files a stylesheet's @font-face rules point at, as paths inside the client folder. A
 * browser fetches the first format it supports in each `src` list (woff2 for every browser the
 * app supports): those are `used`; any later ones are `fallbacks`, which should not exist.
 */
function fontsReferencedBy(clientDir: string, cssFile: string): { used: string[]; fallbacks: string[] } {
  const css = readFileSync(join(clientDir, cssFile), 'utf8')
  const used: string[] = []
  const fallbacks: string[] = []
  for (const face of css.matchAll(/@font-face\s*\{([^}]*)\}/g)) {
    const urls = [...face[1]!.matchAll(/url\(\s*["']?([^"')]+)["']?\s*\)/g)].map((m) => m[1]!)
    urls.forEach((ref, i) => {
      if (ref.startsWith('data:')) return
      const file = ref.startsWith('/') ? ref.slice(1) : posix.join(posix.dirname(cssFile), ref)
      ;(i === 0 ? used : fallbacks).push(file.split(/[?#]/, 1)[0]!)
    })
  }
  return { used, fallbacks }
}

/** Bytes of fonts inlined into a stylesheet as base64 data: URIs (decoded). */
function inlinedFontBytes(clientDir: string, cssFile: string): number {
  const css = readFileSync(join(clientDir, cssFile), 'utf8')
  let bytes = 0
  for (const m of css.matchAll(/url\(\s*["']?data:font\/[a-z0-9+.-]+(?:;[^,;]*)*;base64,([A-Za-z0-9+/=]+)/g)) {
    bytes += Buffer.from(m[1]!, 'base64').length
  }
  return bytes
}

function allFiles(clientDir: string): string[] {
  return readdirSync(clientDir, { recursive: true, encoding: 'utf8' })
    .map((f) => f.split('\\').join('/'))
    .filter((f) => !f.startsWith('.vite/') && statSync(join(clientDir, f)).isFile())
    .sort()
}

export interface PageWeight {
  clientDir: string
  trainFirstLoad: {
    js: Size
    css: Size
    fonts: Size
    other: Size
    files: string[]
    /** Fonts the first-load CSS makes a browser fetch (the first format of each @font-face). */
    fontFiles: string[]
    /** Later formats in those @font-face rules, never fetched by a woff2 browser. */
    fontFallbacks: string[]
    /** woff2 bytes inlined into first-load CSS (counted in CSS). */
    inlinedFontBytes: number
  }
  wholeBuild: Record<Kind | 'total', Size>
  lazy: { what: string; chunks: string[]; inTrainFirstLoad: boolean; found: boolean }[]
  biggest: { file: string; source: string; raw: number; gzip: number; brotli: number; inTrainFirstLoad: boolean }[]
}

/** Measures a build's client folder (the one holding index.html and .vite/manifest.json). */
export function measurePageWeight(clientDir: string): PageWeight {
  const manifestPath = join(clientDir, '.vite/manifest.json')
  if (!existsSync(manifestPath)) throw new Error(`page-weight: no ${manifestPath}; build first (npm run build)`)
  const manifest = JSON.parse(readFileSync(manifestPath, 'utf8')) as Manifest

  const entryKey = Object.keys(manifest).find((k) => manifest[k]!.isEntry && k.endsWith('index.html'))
  if (!entryKey) throw new Error('page-weight: no index.html entry in the manifest')
  // The Train view is either its own lazy chunk or (as now) part of the entry chunk itself.
  const chunks = staticClosure(manifest, manifest[TRAIN_VIEW] ? [entryKey, TRAIN_VIEW] : [entryKey])
  // The start-up code also imports some chunks on first use rather than statically (the API
  // client loads a response's schema with its first request): a first visit fetches those too.
  // Only the route screens (src/views/) are left out, as they load when someone goes there.
  for (const key of onFirstUse(manifest, chunks)) chunks.add(key)
  const firstLoad = new Set<string>()
  for (const key of chunks) {
    firstLoad.add(manifest[key]!.file)
    for (const css of manifest[key]!.css ?? []) firstLoad.add(css)
  }
  // index.html also loads files outside the manifest (the service-worker registration script,
  // icons, the web manifest); every script and stylesheet it names must already be in the set.
  const html = readFileSync(join(clientDir, 'index.html'), 'utf8')
  for (const file of filesLinkedBy(html)) {
    if (!existsSync(join(clientDir, file))) continue
    const kind = kindOf(file)
    if ((kind === 'css' || file.startsWith('assets/')) && !firstLoad.has(file)) {
      throw new Error(`page-weight: index.html loads ${file}, which the manifest walk missed`)
    }
    firstLoad.add(file)
  }
  firstLoad.add('index.html')

  const byKind = (files: Iterable<string>, kind: Kind) => [...files].filter((f) => kindOf(f) === kind)
  const cssFiles = byKind(firstLoad, 'css')
  const fontRefs = cssFiles.map((css) => fontsReferencedBy(clientDir, css))
  const fontFiles = [...new Set(fontRefs.flatMap((r) => r.used))].sort()
  const fontFallbacks = [...new Set(fontRefs.flatMap((r) => r.fallbacks))].sort()

  const everything = allFiles(clientDir)
  const wholeBuild = {
    js: sumSizes(clientDir, byKind(everything, 'js')),
    css: sumSizes(clientDir, byKind(everything, 'css')),
    font: sumSizes(clientDir, byKind(everything, 'font')),
    other: sumSizes(clientDir, byKind(everything, 'other')),
    total: sumSizes(clientDir, everything),
  }

  const lazy: PageWeight['lazy'] = LAZY_SCREENS.map(({ what, src }) => {
    const chunk = manifest[src]
    return { what, chunks: chunk ? [chunk.file] : [], found: !!chunk, inTrainFirstLoad: !!chunk && firstLoad.has(chunk.file) }
  })
  const chartChunks = byKind(everything, 'js').filter((f) => readFileSync(join(clientDir, f), 'utf8').includes(CHART_JS_MARKER))
  lazy.unshift({
    what: 'chart.js',
    chunks: chartChunks,
    found: chartChunks.length > 0,
    inTrainFirstLoad: chartChunks.some((f) => firstLoad.has(f)),
  })

  // What a file holds, as far as the manifest tells: a source path, or the name Rollup gave a
  // shared chunk (after one of its modules).
  const label = (key: string, chunk: ManifestChunk) => (chunk.src && !chunk.src.startsWith('_') ? chunk.src : `shared chunk "${chunk.name ?? key}"`)
  const sourceOf = new Map<string, string>()
  for (const [key, chunk] of Object.entries(manifest)) if (kindOf(chunk.file) === 'js') sourceOf.set(chunk.file, label(key, chunk))
  for (const [key, chunk] of Object.entries(manifest)) {
    for (const css of chunk.css ?? []) if (!sourceOf.has(css)) sourceOf.set(css, `CSS of ${label(key, chunk)}`)
  }
  for (const file of chartChunks) sourceOf.set(file, `chart.js, ${sourceOf.get(file) ?? 'outside the manifest'}`)
  const biggest = [...byKind(everything, 'js'), ...byKind(everything, 'css')]
    .map((file) => ({ file, source: sourceOf.get(file) ?? '(outside the manifest)', ...fileSize(join(clientDir, file)), inTrainFirstLoad: firstLoad.has(file) }))
    .sort((a, b) => b.gzip - a.gzip)
    .slice(0, 12)

  return {
    clientDir,
    trainFirstLoad: {
      js: sumSizes(clientDir, byKind(firstLoad, 'js')),
      css: sumSizes(clientDir, cssFiles),
      fonts: sumSizes(clientDir, fontFiles),
      other: sumSizes(clientDir, byKind(firstLoad, 'other')),
      files: [...firstLoad].sort(),
      fontFiles,
      fontFallbacks,
      inlinedFontBytes: cssFiles.reduce((n, css) => n + inlinedFontBytes(clientDir, css), 0),
    },
    wholeBuild,
    lazy,
    biggest,
  }
}

const kb = (bytes: number) => (bytes / KB).toFixed(2)
const row = (label: string, s: Size, extra = '') => `| ${label} | ${s.files} | ${kb(s.raw)} | ${kb(s.gzip)} | ${kb(s.brotli)} |${extra}`

export function pageWeightBudgets(w: PageWeight): Budget[] {
  const budgets = [
    budget({ name: 'Train route first load, gzip JS', value: Number(kb(w.trainFirstLoad.js.gzip)), limit: BUDGET_FIRST_LOAD_JS_GZIP_KB, unit: 'KB', kind: 'max' }),
    budget({ name: 'Train route first load, gzip CSS', value: Number(kb(w.trainFirstLoad.css.gzip)), limit: BUDGET_FIRST_LOAD_CSS_GZIP_KB, unit: 'KB', kind: 'max' }),
    budget({
      name: 'Lazy chunks (chart.js, plan editor, coach screens, charts) in the Train first load',
      value: w.lazy.filter((l) => l.inTrainFirstLoad).length,
      limit: 0,
      unit: 'chunks',
      kind: 'max',
    }),
    budget({
      name: 'Lazy chunks found in the build (a check that finds nothing proves nothing)',
      value: w.lazy.filter((l) => l.found).length,
      limit: w.lazy.length,
      unit: 'chunks',
      kind: 'min',
    }),
  ]
  return budgets
}

export function pageWeightMarkdown(w: PageWeight, cores: number, root: string): string {
  const f = w.trainFirstLoad
  const b = w.wholeBuild
  const lines = [
    `Read from \`${w.clientDir.startsWith(root) ? relative(root, w.clientDir) : w.clientDir}\` (Vite build manifest). Each file compressed on its own: gzip level 9, brotli quality 11 (node:zlib); 1 KB = 1,000 bytes. Machine: ${cores} cores (sizes do not depend on it).`,
    '',
    '**Train route, first load** (a signed-in lifter opening /train: index.html with the app shell, its static imports, the TrainView chunk with its static imports, the chunks start-up code imports on first use such as response schemas, and their CSS)',
    '',
    '| | files | raw KB | gzip KB | brotli KB | budget |',
    '|---|---:|---:|---:|---:|---|',
    row('JS', f.js, ` gzip ≤ ${BUDGET_FIRST_LOAD_JS_GZIP_KB} KB |`),
    row('CSS', f.css, ` gzip ≤ ${BUDGET_FIRST_LOAD_CSS_GZIP_KB} KB |`),
    row('Fonts (excluded)', f.fonts, ' — |'),
    row('HTML, icons, web manifest', f.other, ' — |'),
    '',
    `Fonts fetched: ${f.fontFiles.map((x) => `\`${posix.basename(x)}\``).join(', ') || 'none'}. ` +
      (f.fontFallbacks.length
        ? `Fallback formats also named (never fetched by a woff2 browser, but built): ${f.fontFallbacks.map((x) => `\`${posix.basename(x)}\``).join(', ')}. `
        : 'No fallback formats. ') +
      `Inlined in the CSS above as data: URIs (counted there): ${f.inlinedFontBytes.toLocaleString('en')} bytes of font (Vant's icon font).`,
    'After the first load the service worker precaches the whole build below, in the background.',
    '',
    '**Whole build** (dist/client without .vite/)',
    '',
    '| | files | raw KB | gzip KB | brotli KB |',
    '|---|---:|---:|---:|---:|',
    row('JS', b.js),
    row('CSS', b.css),
    row('Fonts', b.font),
    row('Other (HTML, images, sounds, service worker data)', b.other),
    row('Total', b.total),
    '',
    '**Kept out of the Train first load**',
    '',
    '| what | chunk | in Train first load |',
    '|---|---|---|',
    ...w.lazy.map((l) => `| ${l.what} | ${l.chunks.map((c) => `\`${posix.basename(c)}\``).join(', ') || '**not found**'} | ${!l.found ? '**unknown**' : l.inTrainFirstLoad ? '**yes**' : 'no'} |`),
    '',
    '**Biggest JS and CSS files** (by gzip)',
    '',
    '| file | from | raw KB | gzip KB | brotli KB | Train first load |',
    '|---|---|---:|---:|---:|---|',
    ...w.biggest.map((c) => `| \`${posix.basename(c.file)}\` | ${c.source} | ${kb(c.raw)} | ${kb(c.gzip)} | ${kb(c.brotli)} | ${c.inTrainFirstLoad ? 'yes' : ''} |`),
  ]
  return lines.join('\n')
}

export async function run(ctx: BenchContext): Promise<BenchPart> {
  const clientDir = join(ctx.distDir, 'client')
  ctx.log(`page weight: reading ${clientDir}`)
  const w = measurePageWeight(clientDir)
  return {
    title: '1. Page weight',
    command: 'npm run build && npx tsx tests/bench/page-weight.ts',
    markdown: pageWeightMarkdown(w, ctx.cores, ctx.root),
    figures: {
      unit: 'bytes',
      trainFirstLoad: w.trainFirstLoad,
      wholeBuild: w.wholeBuild,
      lazy: w.lazy,
      biggest: w.biggest,
    },
    budgets: pageWeightBudgets(w),
  }
}

// Alone: `npx tsx tests/bench/page-weight.ts [distDir]` prints the section for an existing build.
if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..')
  const ctx: BenchContext = {
    root,
    distDir: resolve(process.argv[2] ?? join(root, 'dist')),
    workDir: tmpdir(),
    cores: availableParallelism(),
    log: (line) => process.stderr.write(line + '\n'),
  }
  const part = await run(ctx)
  const verdicts = part.budgets.map((x) => `| ${x.name} | ${x.value} ${x.unit} | ${x.kind === 'max' ? '≤' : '≥'} ${x.limit} ${x.unit} | ${x.pass ? 'PASS' : 'FAIL'} |`)
  process.stdout.write(
    [`## ${part.title}`, '', `\`${part.command}\``, '', part.markdown, '', '| budget | value | limit | |', '|---|---:|---:|---|', ...verdicts, ''].join('\n'),
  )
  if (part.budgets.some((x) => !x.pass)) process.exitCode = 1
}
