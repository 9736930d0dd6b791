/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import { playwright } from '@vitest/browser-playwright';
import { chromiumArgs, chromiumPath } from './test/support/chromium.ts';

// One config for the app build (default), the embeddable components bundle (`--mode components`),
// the test projects and the benchmarks.
export default defineConfig(({ mode }) => ({
  // The components bundle and the library may be copied to any folder of any site: their Web Workers and the
  // parts they load are found relative to the module itself (`new URL('assets/…', import.meta.url)`), never from
  // the site's root.
  base: mode === 'components' || mode === 'library' ? './' : '/',
  server: { host: '127.0.0.1' },
  preview: { host: '127.0.0.1' },
  build:
    mode === 'library'
      ? {
          // The typed library: every method's request reader, runner and core analysis (types in dist/lib/types).
          target: 'es2022',
          outDir: 'dist/lib',
          emptyOutDir: false,
          lib: { entry: 'src/library.ts', formats: ['es'], fileName: () => 'lurk.js' },
          rollupOptions: { external: [/^node:/, 'papaparse', 'jstat', 'mathjs', /^d3-/] },
        }
      : mode === 'components'
      ? {
          // One module script that registers every <lurk-…> element on any page.
          target: 'es2022',
          outDir: 'dist/components',
          lib: { entry: 'components/index.ts', formats: ['es'], fileName: () => 'lurk-components.js' },
        }
      : { target: 'es2022', outDir: 'dist/app', sourcemap: false },
  worker: { format: 'es' },
  // Every package the pages and components import, bundled before the first test page loads: a package found
  // mid-run would make vite re-optimise and reload the browser under a running test.
  optimizeDeps: {
    include: ['lit', 'lit/decorators.js', 'lit/static-html.js', 'lit/directives/unsafe-svg.js', 'papaparse', 'jstat', 'd3-scale', 'd3-shape', 'd3-array', 'd3-contour', 'fast-check', 'axe-core'],
  },
  test: {
    reporters: ['default', './test/support/count-reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          environment: 'node',
          // Every project runs at once on a 2-core machine: generous limits keep a slow moment from failing a test.
          testTimeout: 60_000,
          hookTimeout: 180_000,
          include: ['test/**/*.test.ts'],
          exclude: ['test/browser/**', 'test/e2e/**', 'node_modules/**'],
          setupFiles: ['test/support/propertySeed.ts'],
          benchmark: { include: ['bench/**/*.bench.ts'] },
        },
      },
      {
        extends: true,
        test: {
          name: 'browser',
          testTimeout: 60_000,
          hookTimeout: 180_000,
          include: ['test/browser/**/*.test.ts'],
          browser: {
            enabled: true,
            headless: true,
            screenshotFailures: false,
            provider: playwright({
              launchOptions: { executablePath: chromiumPath, args: chromiumArgs },
            }),
            instances: [{ browser: 'chromium' }],
          },
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['test/e2e/**/*.test.ts'],
          globalSetup: ['test/e2e/serve-built-app.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
}));
