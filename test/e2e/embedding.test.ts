import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build } from 'vite';
import { createServer, type Server } from 'node:http';
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { extname, join, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Locator } from 'playwright-core';
import { SplitMix64 } from '../../src/core/seededRandom';
import { artifactPath, openSession, type BrowserSession } from '../support/browserSession';

// The web components embedded as README's "In your own page" says: the built folder copied to a deep folder of
// another site (/site/vendor/lurk/), README's own example pasted into /site/articles/page.html, served by a plain
// static server with a strict Content-Security-Policy. Every element's Web Worker must start from that folder,
// never from the site's root.

const VENDOR = '/site/vendor/lurk/';
const PAGE = '/site/articles/page.html';
const NONCE = 'fictional-article-nonce';
/** What a strict host might send: its own origin only, no inline code but its own nonced script, no eval. */
const CSP = [
  "default-src 'self'",
  `script-src 'self' 'nonce-${NONCE}'`,
  "style-src 'self'",
  "img-src 'self' blob: data:",
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
].join('; ');

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.wasm': 'application/wasm',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
};

/** The first ```html block of README's "In your own page" section, as written there. */
function readmeExample(): string {
  const readme = readFileSync(fileURLToPath(new URL('../../README.md', import.meta.url)), 'utf8');
  const section = readme.slice(readme.indexOf('## In your own page'));
  const block = /```html\n([\s\S]*?)```/.exec(section);
  if (!block) throw new Error('README has no html example under "In your own page"');
  return block[1];
}

/** A fictional article page around README's example; its inline script gets the site's nonce, nothing else changes. */
function articlePage(example: string): string {
  const nonced = example.replace(/<script type="module">/g, `<script type="module" nonce="${NONCE}">`);
  return `<!doctype html>
<html lang="en">
  <head>
    <meta charset="utf-8" />
    <link rel="icon" href="data:," />
    <title>A fictional article</title>
  </head>
  <body>
    <main>
      <h1>Cycling to work and blood pressure (a fictional article)</h1>
${nonced}
    </main>
  </body>
</html>
`;
}

/** A static file server over `root` that sends the site's CSP with every response and records each path asked for. */
function staticServer(root: string, asked: { path: string; status: number }[]): Server {
  return createServer((request, response) => {
    const path = decodeURIComponent(new URL(request.url ?? '/', 'http://127.0.0.1').pathname);
    const file = resolve(root, '.' + path);
    let status = 404;
    let body: Buffer | string = 'not found';
    let type = 'text/plain; charset=utf-8';
    if (request.method === 'GET' && (file + sep).startsWith(root + sep) && isFile(file)) {
      status = 200;
      body = readFileSync(file);
      type = MIME[extname(file)] ?? 'application/octet-stream';
    }
    asked.push({ path, status });
    response.writeHead(status, {
      'Content-Type': type,
      'Content-Security-Policy': CSP,
      'X-Content-Type-Options': 'nosniff',
      'Cache-Control': 'no-store',
    });
    response.end(body);
  });
}

function isFile(path: string): boolean {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

// ——— fictional data, made here with a seeded generator ———

const random = new SplitMix64(20_261_202);
const normal = (): number => Math.sqrt(-2 * Math.log(1 - random.nextDouble())) * Math.cos(2 * Math.PI * random.nextDouble());
const round1 = (v: number): string => v.toFixed(1);
/** A free-text column long enough to make `rows` rows exceed 1 MiB: such a file is read in the Web Worker. */
const padding = (rows: number): string => 'fictional note '.repeat(Math.ceil((1.1 * 2 ** 20) / rows / 15));

/** Fictional matched pairs (one row per pair), over 1 MiB. */
function pairsCsv(): string {
  const pairs = 2000;
  const note = padding(pairs);
  const rows = ['pair,cyclist_bp,driver_bp,note'];
  for (let i = 1; i <= pairs; i++) {
    const driver = 132 + 12 * normal();
    rows.push(`${i},${round1(driver - 4 + 8 * normal())},${round1(driver)},${note}`);
  }
  return rows.join('\n') + '\n';
}

/** Fictional matched sets (one cyclist and two drivers each, one row per person), over 1 MiB. */
function setsCsv(): string {
  const sets = 1500;
  const note = padding(sets * 3);
  const rows = ['matched_set,cycles,bp,note'];
  for (let s = 1; s <= sets; s++) {
    const level = 132 + 10 * normal();
    rows.push(`set${s},1,${round1(level - 5 + 8 * normal())},${note}`);
    for (let c = 0; c < 2; c++) rows.push(`set${s},0,${round1(level + 8 * normal())},${note}`);
  }
  return rows.join('\n') + '\n';
}

/** Fictional people: minutes cycled a day, age, income and blood pressure. */
function regressionCsv(): string {
  const rows = ['bp,cycling_minutes,age,income'];
  for (let i = 0; i < 400; i++) {
    const age = 25 + 40 * random.nextDouble();
    const income = 30 + 40 * random.nextDouble();
    const minutes = Math.max(0, 20 - 0.2 * (age - 45) + 0.1 * (income - 50) + 10 * normal());
    rows.push(`${round1(122 + 0.15 * age - 0.1 * income - 0.25 * minutes + 8 * normal())},${round1(minutes)},${round1(age)},${round1(income)}`);
  }
  return rows.join('\n') + '\n';
}

/** Fictional people: whether they cycle to work (0/1), blood pressure, age and income. */
function weightingCsv(): string {
  const rows = ['cycles,bp,age,income'];
  for (let i = 0; i < 400; i++) {
    const age = 25 + 40 * random.nextDouble();
    const income = 30 + 40 * random.nextDouble();
    const cycles = random.nextDouble() < 1 / (1 + Math.exp(0.04 * (age - 45) - 0.03 * (income - 50))) ? 1 : 0;
    rows.push(`${cycles},${round1(112 + 0.45 * age - 0.1 * income - 5 * cycles + 8 * normal())},${round1(age)},${round1(income)}`);
  }
  return rows.join('\n') + '\n';
}

const csvFile = (name: string, text: string) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(text) });

describe(`the web components copied to ${VENDOR} of another site`, () => {
  let session: BrowserSession;
  let server: Server;
  let origin = '';
  let siteRoot = '';
  const asked: { path: string; status: number }[] = [];
  const workers: string[] = [];
  const logs: string[] = [];

  beforeAll(async () => {
    siteRoot = mkdtempSync(join(tmpdir(), 'lurk-embedding-'));
    const built = join(siteRoot, 'built-components');
    // The components step of `npm run build` (vite.config.ts, mode "components"), into a folder of its own.
    await build({ mode: 'components', logLevel: 'warn', build: { outDir: built, emptyOutDir: true } });
    cpSync(built, join(siteRoot, VENDOR), { recursive: true });
    rmSync(built, { recursive: true });
    mkdirSync(join(siteRoot, 'site/articles'), { recursive: true });
    writeFileSync(join(siteRoot, PAGE), articlePage(readmeExample()));

    server = staticServer(siteRoot, asked);
    await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
    const address = server.address();
    if (!address || typeof address === 'string') throw new Error('the site server has no TCP address');
    origin = `http://127.0.0.1:${address.port}`;

    session = await openSession({ width: 1280, height: 1000 });
    session.page.on('worker', (worker) => workers.push(worker.url()));
    session.page.on('console', (message) => logs.push(message.text()));
    await session.page.goto(origin + PAGE);
  });

  afterAll(async () => {
    await session?.close();
    await new Promise<void>((done) => (server ? server.close(() => done()) : done()));
    if (siteRoot) rmSync(siteRoot, { recursive: true, force: true });
  });

  const element = (tag: string): Locator => session.page.locator(tag);
  /** Text of the first match of a selector inside an element's shadow root ("" when none). */
  const shadowText = (tag: string, selector: string): Promise<string> =>
    session.page.evaluate(([t, s]) => document.querySelector(t)?.shadowRoot?.querySelector(s)?.textContent?.trim() ?? '', [tag, selector]);

  it('loads README\'s example from /site/articles/ with a relative module script and defines every calculator', async () => {
    expect(readmeExample()).toContain('<script type="module" src="../vendor/lurk/lurk-components.js"></script>');
    const defined = await session.page.evaluate(() =>
      ['lurk-evalue', 'lurk-pairs', 'lurk-sets', 'lurk-ovb', 'lurk-weighting'].map((tag) => customElements.get(tag) !== undefined),
    );
    expect(defined).toEqual([true, true, true, true, true]);
    expect(asked.find((a) => a.path === `${VENDOR}lurk-components.js`)?.status).toBe(200);
  });

  it('<lurk-evalue> shows the E-values of the inputs README sets', async () => {
    // RR 0.72 (0.61–0.85): E = 1/RR + sqrt(1/RR × (1/RR − 1)) (VanderWeele & Ding 2017, for RR < 1 take 1/RR):
    // 1.3889 + sqrt(1.3889 × 0.3889) = 2.12; for the limit nearer 1, 1/0.85: 1.1765 + sqrt(1.1765 × 0.1765) = 1.63.
    await expect.poll(() => shadowText('lurk-evalue', '#evalue-estimate'), { timeout: 20_000 }).toBe('2.12');
    expect(await shadowText('lurk-evalue', '#evalue-interval')).toBe('1.63');
  });

  /**
   * Waits until an element shows its result (a match of `resultSelector` in its shadow root) or a failure (a
   * worker that failed or could not start, a file that could not be read), and says which: "result" or "failed: …".
   */
  const settled = async (tag: string, resultSelector: string): Promise<string> => {
    const state = () =>
      session.page.evaluate(
        ([t, s]) => {
          const root = document.querySelector(t)?.shadowRoot;
          const failure = /[^.]*(could not start|worker failed|could not be read)[^.]*/.exec(root?.textContent ?? '');
          if (failure) return `failed: ${failure[0].trim()}`;
          return root?.querySelector(s) ? 'result' : 'waiting';
        },
        [tag, resultSelector],
      );
    await expect.poll(state, { timeout: 50_000, interval: 250 }).not.toBe('waiting');
    return state();
  };

  it('<lurk-pairs> reads a fictional file over 1 MiB in its Web Worker and shows the bounds', async () => {
    await element('lurk-pairs').getByLabel('CSV file', { exact: true }).setInputFiles(csvFile('pairs-fictional.csv', pairsCsv()));
    expect(await settled('lurk-pairs', '#bounds-table tbody tr')).toBe('result');
    expect(await shadowText('lurk-pairs', '#pairs-counts')).toMatch(/2,000 pairs/);
    expect(await shadowText('lurk-pairs', '#tipping-gamma')).toMatch(/^\d/);
    expect(workers.some((url) => /pairsWorker-[\w-]+\.js$/.test(url))).toBe(true);
  });

  it('<lurk-sets> reads a fictional file over 1 MiB in its Web Worker and shows the bounds', async () => {
    await element('lurk-sets').getByLabel('CSV file', { exact: true }).setInputFiles(csvFile('sets-fictional.csv', setsCsv()));
    expect(await settled('lurk-sets', '#bounds-table tbody tr')).toBe('result');
    expect(await shadowText('lurk-sets', '#sets-counts')).toMatch(/1,500 matched sets/);
    expect(await shadowText('lurk-sets', '#tipping-gamma')).toMatch(/^\d/);
    expect(workers.some((url) => /setsWorker-[\w-]+\.js$/.test(url))).toBe(true);
  });

  it('<lurk-ovb> fits a fictional file in its Web Worker and shows the robustness values', async () => {
    const ovb = element('lurk-ovb');
    await ovb.getByLabel('CSV file', { exact: true }).setInputFiles(csvFile('regression-fictional.csv', regressionCsv()));
    await ovb.getByRole('button', { name: 'Fit the regression' }).click();
    expect(await settled('lurk-ovb', '#rv')).toBe('result');
    expect(await shadowText('lurk-ovb', '#rv')).toMatch(/^\d+(\.\d+)?%$/);
    expect(workers.some((url) => /regressionWorker-[\w-]+\.js$/.test(url))).toBe(true);
  });

  it('<lurk-weighting> reads, fits and resamples a fictional file in its Web Worker and shows the bounds', async () => {
    await element('lurk-weighting').getByLabel('CSV file', { exact: true }).setInputFiles(csvFile('weighting-fictional.csv', weightingCsv()));
    expect(await settled('lurk-weighting', '#bounds-table tbody tr')).toBe('result');
    // One row per Λ of README's inputs (1, 1.5, 2).
    expect(await session.page.evaluate(() => document.querySelector('lurk-weighting')?.shadowRoot?.querySelectorAll('#bounds-table tbody tr').length)).toBe(3);
    expect(await shadowText('lurk-weighting', '#effect')).toMatch(/\d/);
    expect(workers.some((url) => /weightingWorker-[\w-]+\.js$/.test(url))).toBe(true);
    await session.page.screenshot({ path: artifactPath('embedded-page-1280.png'), fullPage: true });
    // The top of each element as a reader sees it (the whole page is very tall): look at these.
    for (const tag of ['lurk-evalue', 'lurk-pairs', 'lurk-sets', 'lurk-ovb', 'lurk-weighting']) {
      await element(tag).evaluate((e) => e.scrollIntoView());
      await session.page.screenshot({ path: artifactPath(`embedded-${tag}-1280.png`) });
    }
  });

  it(`starts every Web Worker from ${VENDOR}assets/ and asks nothing of the site's root or any other origin`, () => {
    console.info(`worker URLs: ${workers.join(', ')}`);
    expect(workers.length).toBeGreaterThanOrEqual(4);
    for (const url of workers) expect(url.startsWith(`${origin}${VENDOR}assets/`), url).toBe(true);
    const outside = session.requests.filter((url) => !url.startsWith(origin + '/') && !url.startsWith('data:') && !url.startsWith('blob:'));
    expect(outside).toEqual([]);
    // Every path the server was asked for is the page or a file of the copied folder, and each was there.
    expect(asked.filter((a) => a.path !== PAGE && !a.path.startsWith(VENDOR))).toEqual([]);
    expect(asked.filter((a) => a.status !== 200)).toEqual([]);
  });

  it('shows no page error and no Content-Security-Policy violation', () => {
    expect(session.errors).toEqual([]);
    expect(logs.filter((text) => /Content Security Policy|Refused to/i.test(text))).toEqual([]);
    // README's listener logs each element's result (files chosen by the reader fire `lurk-result`).
    for (const tag of ['lurk-pairs', 'lurk-sets', 'lurk-ovb', 'lurk-weighting']) expect(logs).toContain(`${tag} result`);
  });
});
