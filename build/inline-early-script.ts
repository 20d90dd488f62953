/**
 * Vite plugin: inline src/early/page-script.ts (bundled on its own by esbuild, minified) into
 * index.html's <head>, ahead of the app's script and stylesheet tags. A classic inline script
 * runs as soon as the parser reaches it, before the stylesheet or the app's JavaScript have
 * arrived, so today's request leaves with the page instead of after the app has loaded. With
 * it, the script preloads the chunks that check the answer (the schema module named below and
 * its static imports, read from the bundle): the app would ask for them only once it runs.
 *
 * The server allows exactly the inline scripts of the built index.html in its content security
 * policy, by their SHA-256 hash (server/middleware/security.ts `inlineScriptHashes`).
 */
import { fileURLToPath } from 'node:url'
import { build } from 'esbuild'
import type { Plugin, Rollup } from 'vite'

const ENTRY = fileURLToPath(new URL('../src/early/page-script.ts', import.meta.url))
/** The module that checks today's answer (src/api/train.ts imports it lazily). */
const TODAY_SCHEMA = fileURLToPath(new URL('../shared/schemas/train.schema.ts', import.meta.url))
/** Anything bigger would cost the first paint more than the early request saves. */
const MAX_BYTES = 2_000

export async function bundleEarlyScript(entry: string = ENTRY, modules: readonly string[] = []): Promise<string> {
  const result = await build({
    define: { __EARLY_TODAY_MODULES__: JSON.stringify(modules) },
    entryPoints: [entry],
    bundle: true,
    write: false,
    format: 'iife',
    minify: true,
    target: 'es2020',
    platform: 'browser',
    legalComments: 'none',
  })
  const code = result.outputFiles[0]!.text.trim()
  if (Buffer.byteLength(code) > MAX_BYTES) throw new Error(`the inlined early script is ${Buffer.byteLength(code)} bytes (at most ${MAX_BYTES})`)
  if (code.includes('</script')) throw new Error('the inlined early script contains "</script"')
  return code
}

/**
 * The files of the chunk that holds `source` and of every chunk it imports statically, except
 * the entry chunks (index.html loads those anyway), as absolute URLs under `base`.
 */
export function chunkFilesFor(bundle: Rollup.OutputBundle, source: string, base: string): string[] {
  const chunks = Object.values(bundle).filter((o): o is Rollup.OutputChunk => o.type === 'chunk')
  const root = chunks.find((c) => c.moduleIds.includes(source))
  if (!root) throw new Error(`no chunk holds ${source}: the early script cannot preload it`)
  const byName = new Map(chunks.map((c) => [c.fileName, c]))
  const files: string[] = []
  const visit = (chunk: Rollup.OutputChunk) => {
    if (chunk.isEntry || files.includes(base + chunk.fileName)) return
    files.push(base + chunk.fileName)
    for (const name of chunk.imports) visit(byName.get(name)!)
  }
  visit(root)
  return files
}

export function inlineEarlyScript(entry: string = ENTRY): Plugin {
  let base = '/'
  return {
    name: 'chalkline:inline-early-script',
    configResolved(config) {
      base = config.base
    },
    transformIndexHtml: {
      // After the bundle is written, so its chunk names are known (the dev server has none).
      order: 'post',
      async handler(html, ctx) {
        // Right after the title: before the tags Vite adds for the app's script and stylesheet
        // (an inline script after a stylesheet link would wait for the stylesheet).
        if (!html.includes('</title>')) throw new Error('index.html has no </title> to place the early script after')
        const modules = ctx.bundle ? chunkFilesFor(ctx.bundle, TODAY_SCHEMA, base) : []
        const code = await bundleEarlyScript(entry, modules)
        return html.replace('</title>', `</title>\n    <script>${code}</script>`)
      },
    },
  }
}
