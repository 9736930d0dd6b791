import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { artifactPath, openSession, type BrowserSession } from '../support/browserSession';

const baseUrl = inject('baseUrl');
const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** The appraisal the page holds now, without the time stamp. */
async function currentAppraisal(page: Page): Promise<Record<string, unknown>> {
  return page.evaluate(() => {
    const { savedAt: _ignored, ...rest } = (document.querySelector('lurk-app') as unknown as { appraisal: Record<string, unknown> }).appraisal;
    return JSON.parse(JSON.stringify(rest));
  });
}

async function openTab(page: Page, name: string): Promise<void> {
  await page.getByRole('tab', { name }).click();
}

describe('the appraisal workspace in Chromium', () => {
  let session: BrowserSession;

  beforeAll(async () => {
    session = await openSession({ width: 1280, height: 900 });
    await session.page.goto(baseUrl);
    await session.page.locator('lurk-evalue').waitFor();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('opens the fictional demo with all three calculators showing numbers', async () => {
    const { page } = session;
    // E-values of RR 0.72 (0.61–0.85): 1/0.72 = 1.389 → 1.389 + √(1.389·0.389) = 2.12; 1/0.85 → 1.63 (hand computation)
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('2.12');
    await expect.poll(() => page.locator('#evalue-interval').textContent()).toBe('1.63');
    await page.screenshot({ path: artifactPath('workspace-1280.png'), fullPage: true });
    await openTab(page, 'Matched pairs');
    await expect.poll(() => page.locator('lurk-pairs #tipping-gamma').textContent()).toMatch(/^\d+\.\d{3}$/);
    await page.screenshot({ path: artifactPath('workspace-pairs-1280.png'), fullPage: true });
    await openTab(page, 'Regression');
    // Reported t = −4.1/1.2 with df 1482: RV = ½(√(f⁴ + 4f²) − f²), f = |t|/√df (Cinelli & Hazlett 2020) = 8.5%
    await expect.poll(() => page.locator('lurk-ovb #rv').textContent()).toBe('8.5%');
    await page.screenshot({ path: artifactPath('workspace-regression-1280.png'), fullPage: true });
    expect(await page.locator('lurk-app').textContent()).not.toMatch(/NaN|undefined|Infinity/);
  });

  it('writes a robustness statement with the E-value, tipping Γ and RV computed from the inputs, in three formats', async () => {
    const { page } = session;
    const tipping = await page.locator('lurk-pairs #tipping-gamma').textContent();
    await openTab(page, 'Robustness statement');
    const article = page.getByRole('article', { name: 'Robustness statement' });
    await expect.poll(() => article.textContent()).toContain('E-value for the point estimate is 2.12');
    expect(await article.textContent()).toContain(`up to Γ = ${tipping}`);
    expect(await article.textContent()).toContain('The robustness value is 8.5%');
    await page.getByRole('radio', { name: 'LaTeX' }).check();
    expect(await page.locator('#statement-text').inputValue()).toContain('\\subsection*{');
    await page.screenshot({ path: artifactPath('statement-1280.png'), fullPage: true });
  });

  it('gives the bottom line in plain words with the caution', async () => {
    const { page } = session;
    await openTab(page, 'Bottom line');
    const section = page.getByRole('region', { name: 'Bottom line' });
    await expect.poll(() => section.textContent()).toContain('at least 2.12 times as likely');
    expect(await section.textContent()).toContain('licensed practice');
  });

  it('saves the appraisal as JSON and opens it again exactly', async () => {
    const { page } = session;
    const before = await currentAppraisal(page);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Save appraisal' }).click()]);
    const path = artifactPath('saved-appraisal.json');
    await download.saveAs(path);
    const saved = JSON.parse(readFileSync(path, 'utf8'));
    expect(saved.format).toBe('lurk-appraisal');
    expect(saved.version).toBe(2);

    // Change something, then open the saved file: everything comes back.
    await page.getByLabel('Finding', { exact: true }).fill('Something else entirely');
    expect((await currentAppraisal(page)).study).not.toEqual(before.study);
    await page.locator('#open-appraisal').setInputFiles(path);
    await expect.poll(() => currentAppraisal(page)).toEqual(before);
  });

  it('restores everything after a reload (kept in this browser)', async () => {
    const { page } = session;
    await openTab(page, 'Reported estimate');
    await page.getByLabel('Finding', { exact: true }).fill('Kept across a reload (fictional)');
    await page.locator('lurk-evalue').getByLabel('Estimate', { exact: true }).fill('0.7');
    const before = await currentAppraisal(page);
    await page.reload();
    await page.locator('lurk-evalue').waitFor();
    await expect.poll(() => currentAppraisal(page)).toEqual(before);
    expect(await page.getByText('Fictional demo:').count()).toBe(0);
    await page.locator('lurk-evalue').getByLabel('Estimate', { exact: true }).fill('0.72');
  });

  it('refuses a file that is not an appraisal and keeps the current work', async () => {
    const { page } = session;
    const before = await currentAppraisal(page);
    await page.locator('#open-appraisal').setInputFiles({ name: 'other.json', mimeType: 'application/json', buffer: Buffer.from('{"format":"something else"}') });
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'cannot be opened' }).count()).toBeGreaterThan(0);
    expect(await currentAppraisal(page)).toEqual(before);
  });

  it('makes a share link that restores the inputs exactly in a new page', async () => {
    const { page, browser } = session;
    const before = await currentAppraisal(page);
    await page.getByRole('button', { name: 'Copy share link' }).click();
    const link = page.url();
    expect(link).toContain('#appraisal=2.');
    const other = await browser.newPage();
    await other.goto(link);
    await other.locator('lurk-evalue').waitFor();
    // A share link never carries raw data rows: the pasted pair differences stay behind (the field opens empty),
    // their summary travels.
    const expected = structuredClone(before) as typeof before & { findings: { method: string; inputs: Record<string, unknown> }[] };
    const pairs = expected.findings.find((f) => f.method === 'pairs')!;
    pairs.inputs.pasted = '';
    await expect.poll(() => currentAppraisal(other)).toEqual(expected);
    await other.close();
  });

  it('refuses a tampered share link with a message and keeps the work of this browser', async () => {
    const { page, browser } = session;
    await page.getByRole('button', { name: 'Copy share link' }).click();
    const link = page.url();
    const [head, payload, check] = link.split('.').length > 3 ? splitLink(link) : splitLink(link);
    const tampered = `${head}.${payload.slice(0, 20)}${payload[20] === 'A' ? 'B' : 'A'}${payload.slice(21)}.${check}`;
    const other = await browser.newPage();
    await other.goto(tampered);
    await other.locator('lurk-app').waitFor();
    await expect.poll(() => other.getByRole('status').filter({ hasText: 'was changed after it was made' }).count()).toBeGreaterThan(0);
    await other.close();
  });

  it('loads a CSV of pairs through the file input and exports a figure', async () => {
    const { page } = session;
    await openTab(page, 'Matched pairs');
    await page.locator('lurk-pairs').getByLabel('A CSV file of pairs').check();
    await page.locator('lurk-pairs').getByLabel('The finding').selectOption('greater');
    await page.locator('lurk-pairs').getByLabel('CSV file', { exact: true }).setInputFiles(fileURLToPath(new URL('../reference/rosenbaum_small_n15.csv', import.meta.url)));
    // R 4.2.2 (rosenbaum.json, small_n15): exact signed-rank sensitivity value 1.6118…, floored to 1.611
    await expect.poll(() => page.locator('lurk-pairs #tipping-gamma').textContent()).toBe('1.611');
    const [svg] = await Promise.all([page.waitForEvent('download'), page.locator('lurk-pairs lurk-plot').first().getByRole('button', { name: /as SVG/ }).click()]);
    expect(svg.suggestedFilename()).toMatch(/\.svg$/);
    const [png] = await Promise.all([page.waitForEvent('download'), page.locator('lurk-pairs lurk-plot').first().getByRole('button', { name: /as PNG/ }).click()]);
    const pngPath = artifactPath('exported-figure.png');
    await png.saveAs(pngPath);
    const bytes = new Uint8Array(readFileSync(pngPath));
    // PNG width from the IHDR chunk: 3.5 inches at 300 dpi
    expect(new DataView(bytes.buffer).getUint32(16)).toBe(1050);
  });

  it('made no request beyond its own origin during the whole session', () => {
    const origin = new URL(baseUrl).origin;
    const outside = session.requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'));
    expect(outside).toEqual([]);
    expect(session.errors).toEqual([]);
  });
});

/** Splits a share URL into (everything up to the version mark, payload, check digits). */
function splitLink(link: string): [string, string, string] {
  const at = link.indexOf('#appraisal=');
  const [version, payload, check] = link.slice(at + '#appraisal='.length).split('.');
  return [`${link.slice(0, at)}#appraisal=${version}`, payload, check];
}

describe('accessibility and layout', () => {
  for (const width of [390, 1280]) {
    it(`has no automated accessibility violations (axe-core) at ${width} px, and looks right`, async () => {
      const session = await openSession({ width, height: 900 });
      try {
        // axe is injected as an inline script, which the page's own policy rightly forbids: bypass it for the audit only.
        const context = await session.browser.newContext({ viewport: { width, height: 900 }, bypassCSP: true });
        const page = await context.newPage();
        await page.goto(baseUrl);
        await page.locator('lurk-evalue').waitFor();
        await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('2.12');
        await page.addScriptTag({ content: axeSource });
        const views = ['Reported estimate', 'Matched pairs', 'Matched sets', 'Regression', 'Weighting', 'Robustness statement', 'Bottom line', 'Many findings'];
        for (const view of views) {
          await page.getByRole('tab', { name: view }).click();
          const violations = await page.evaluate(async () => {
            const result = await (window as unknown as { axe: { run: (c: unknown) => Promise<{ violations: { id: string; nodes: { target: unknown }[] }[] }> } }).axe.run(document);
            return result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => JSON.stringify(n.target)).join(' ')}`);
          });
          expect(violations, view).toEqual([]);
        }
        await page.getByRole('tab', { name: 'Reported estimate' }).click();
        await page.screenshot({ path: artifactPath(`layout-${width}.png`), fullPage: true });
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
        expect(overflow).toBeLessThanOrEqual(0);
      } finally {
        await session.close();
      }
    }, 120_000);
  }

  it('reaches every tab by keyboard with a visible focus', async () => {
    const session = await openSession({ width: 1280, height: 900 });
    try {
      const { page } = session;
      await page.goto(baseUrl);
      await page.locator('lurk-evalue').waitFor();
      await page.getByRole('tab', { name: 'Reported estimate' }).focus();
      await page.keyboard.press('ArrowRight');
      await expect.poll(() => page.getByRole('tab', { name: 'Matched pairs' }).getAttribute('aria-selected')).toBe('true');
      await page.keyboard.press('End');
      await expect.poll(() => page.getByRole('tab', { name: 'Many findings' }).getAttribute('aria-selected')).toBe('true');
      const outline = await page.evaluate(() => {
        const app = document.querySelector('lurk-app')!;
        const focused = app.shadowRoot!.activeElement as HTMLElement;
        return getComputedStyle(focused).outlineStyle;
      });
      expect(outline).not.toBe('none');
    } finally {
      await session.close();
    }
  });
});
