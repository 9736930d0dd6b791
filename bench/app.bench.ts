// The shipped app: its JavaScript size gzipped (goal: at most 250 KB) and the time from navigation to the demo's
// first E-value on screen in headless Chromium. Run: npm run bench -- bench/app.bench.ts
import { afterAll, beforeAll, bench, describe } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { build, preview, type PreviewServer } from 'vite';
import { chromium, type Browser } from 'playwright-core';
import { chromiumArgs, chromiumPath } from '../test/support/chromium';

const OUT = 'dist/bench-app';
let server: PreviewServer;
let browser: Browser;
let url = '';

beforeAll(async () => {
  await build({ logLevel: 'warn', build: { outDir: OUT, emptyOutDir: true } });
  const files = readdirSync(`${OUT}/assets`).filter((f) => f.endsWith('.js'));
  let raw = 0;
  let gzipped = 0;
  for (const f of files) {
    const bytes = readFileSync(`${OUT}/assets/${f}`);
    raw += bytes.length;
    gzipped += gzipSync(bytes, { level: 9 }).length;
  }
  const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`;
  console.log(`\napp JavaScript: ${files.length} files, ${kb(raw)} raw, ${kb(gzipped)} gzipped (goal: at most 250 KB gzipped)`);
  server = await preview({ logLevel: 'warn', build: { outDir: OUT }, preview: { host: '127.0.0.1', port: 0 } });
  const address = server.httpServer.address();
  if (!address || typeof address === 'string') throw new Error('no address');
  url = `http://127.0.0.1:${address.port}/`;
  browser = await chromium.launch({ executablePath: chromiumPath, args: chromiumArgs, headless: true });
}, 120_000);

afterAll(async () => {
  await browser?.close();
  await new Promise<void>((resolve) => server?.httpServer.close(() => resolve()));
});

describe('app', () => {
  bench(
    'time to first render of the demo (navigation → first E-value shown)',
    async () => {
      const context = await browser.newContext();
      const page = await context.newPage();
      await page.goto(url);
      await page.locator('#evalue-estimate').filter({ hasText: /\d/ }).waitFor();
      await context.close();
    },
    { iterations: 10, warmupIterations: 1, time: 0 },
  );
});
