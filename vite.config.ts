import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import Components from 'unplugin-vue-components/vite'
import { VantResolver } from '@vant/auto-import-resolver'
import { VitePWA } from 'vite-plugin-pwa'
import { vantIconSubset } from './build/vant-icon-subset.js'

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
}

export default defineConfig({
  plugins: [
    vue(),
    // Vant's inlined icon font cut to the icons the app can show, and never its CDN copy.
    vantIconSubset(),
    // Installable, and the app shell, fonts and sounds are cached so a started session runs with
    // no network after one visit. The API is never cached: sets wait in the runner's outbox.
    VitePWA({
      registerType: 'autoUpdate',
      // Deferred, so registering the service worker never holds up the first paint.
      injectRegister: 'script-defer',
      includeAssets: ['favicon.svg', 'icons/apple-touch-icon.png', 'sounds/*.wav'],
      manifest: {
        name: 'Chalkline',
        short_name: 'Chalkline',
        description: 'Your training session, one set at a time, and your coach\'s review.',
        theme_color: '#12343B',
        background_color: '#F2EFE6',
        display: 'standalone',
        start_url: '/train',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2,wav}'],
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//, /^\/dev\//],
        maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
        // Take over open pages as soon as the cache is ready, so the first visit already works offline.
        clientsClaim: true,
        skipWaiting: true,
      },
    }),
    // Vant components are imported on demand; function APIs (showToast...) are imported by hand.
    Components({ resolvers: [VantResolver()], dts: false }),
  ],
  resolve: { alias },
  // Vue's compile-time flags (vuejs.org, "Compile-Time Flags"): every component here, ours and
  // Vant's, uses setup(), so the Options API support is left out of the bundle.
  define: {
    __VUE_OPTIONS_API__: 'false',
    __VUE_PROD_DEVTOOLS__: 'false',
    __VUE_PROD_HYDRATION_MISMATCH_DETAILS__: 'false',
  },
  server: {
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000', '/dev': 'http://127.0.0.1:3000' },
  },
  build: {
    outDir: 'dist/client',
    manifest: true,
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        codeSplitting: {
          // Everything the entry imports statically (the app shell, Vue, Vant's parts in use and
          // the Train screen) in one file: over HTTP/1.1 a first visit otherwise waited on two
          // dozen small files, a round trip each per connection. Lazy screens stay split.
          groups: [{ name: 'app', tags: ['$initial'] }],
        },
      },
    },
  },
  test: {
    // Vant ships .css imports inside its ES build: let Vite transform it.
    server: { deps: { inline: ['vant'] } },
    projects: [
      {
        extends: true,
        test: { name: 'shared', include: ['tests/shared/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          testTimeout: 20_000,
          // Seeding the demo club in beforeAll takes seconds, longer on a busy 2-core machine.
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'jsdom', setupFiles: ['tests/client/helpers/indexeddb-setup.ts', 'tests/client/helpers/lazy-schemas-setup.ts'] },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 90_000,
        },
      },
    ],
  },
})
