// The weighting calculator on the page, end to end in Debian's Chromium: the built app served on 127.0.0.1, the
// same invented 100,000 people × 5 covariates file as bench/weightingCli.bench.ts (fictional), B = 200, ATE —
// chosen in the file input, read, fitted and resampled in the page's Web Worker with progress, until the bounds
// table shows. Prints the wall time, the page's peak JavaScript heap (Chrome DevTools Protocol metrics, sampled
// while it runs) and the peak resident memory of the renderer process that runs the page and its worker (VmHWM
// from /proc). Measures only; asserts nothing.
// Run once: npx vitest bench --run --project unit bench/weightingPage.bench.ts
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { build, preview } from 'vite';
import { afterAll, bench, describe } from 'vitest';
import { fictionalCsv } from './weightingFixture';
import { chromiumArgs, chromiumPath } from '../test/support/chromium';

const folder = mkdtempSync(join(tmpdir(), 'lurk-weighting-page-bench-'));
const csv = join(folder, 'fictional-100k.csv');
writeFileSync(csv, fictionalCsv(100_000, 20261202));
await build({ logLevel: 'warn', build: { outDir: join(folder, 'app'), emptyOutDir: true } });
const server = await preview({ logLevel: 'warn', build: { outDir: join(folder, 'app') }, preview: { host: '127.0.0.1', port: 0, strictPort: false, open: false } });
const address = server.httpServer.address();
const baseUrl = typeof address === 'object' && address ? `http://127.0.0.1:${address.port}/` : '';
const browser = await chromium.launch({ executablePath: chromiumPath, args: chromiumArgs });
afterAll(async () => {
  await browser.close();
  await new Promise<void>((resolve) => server.httpServer.close(() => resolve()));
  rmSync(folder, { recursive: true, force: true });
});

/** The largest VmHWM (peak resident set) among Chromium's renderer processes, in MiB, or "unknown". */
function rendererPeakMiB(): string {
  const peaks: number[] = [];
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      if (!readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('--type=renderer')) continue;
      const kb = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1];
      if (kb) peaks.push(Number(kb) / 1024);
    } catch {
      // a process that ended meanwhile
    }
  }
  return peaks.length ? Math.max(...peaks).toFixed(0) : 'unknown';
}

describe("the weighting calculator's Web Worker on the page", () => {
  bench(
    '100,000 people × 5 covariates, B = 200',
    async () => {
      const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
      const cdp = await page.context().newCDPSession(page);
      await cdp.send('Performance.enable');
      let peakPageHeap = 0;
      await page.goto(baseUrl);
      await page.getByRole('tab', { name: 'Weighting' }).click();
      const calculator = page.locator('lurk-weighting');
      await calculator.getByLabel('Bootstrap resamples').fill('200');
      const started = performance.now();
      await calculator.getByLabel('CSV file', { exact: true }).setInputFiles(csv);
      const sampler = setInterval(async () => {
        const { metrics } = await cdp.send('Performance.getMetrics');
        const used = metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? 0;
        peakPageHeap = Math.max(peakPageHeap, used);
      }, 250);
      await calculator.locator('#bounds-table tbody tr').first().waitFor({ timeout: 600_000 });
      const wall = (performance.now() - started) / 1000;
      clearInterval(sampler);
      const rows = await calculator.locator('#bounds-table tbody tr').count();
      console.log(
        `page worker, 100,000 × 5, B = 200: wall ${wall.toFixed(1)} s from choosing the file to the bounds table (${rows} Λ rows); ` +
          `peak JS heap of the page ${(peakPageHeap / 2 ** 20).toFixed(0)} MiB; peak resident memory of the renderer (page and worker) ${rendererPeakMiB()} MiB`,
      );
      await page.close();
    },
    { iterations: 1, warmupIterations: 0, time: 0 },
  );
});
