// Several findings of one paper in one appraisal, end to end in the built app: appraise three findings (an odds
// ratio and a hazard ratio with the E-value, a regression coefficient with the robustness value), save the file,
// open it again, share it (the link opened in a fresh browser), reload, and read all three back in the statement
// and the bottom line. Screenshots go to /tmp/ws-shots/ (not committed): look at them.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { mkdirSync, readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { artifactPath, openSession, type BrowserSession } from '../support/browserSession';
import { SHARE_LINK_LIMIT } from '../../src/workspace/shareLink';

const baseUrl = inject('baseUrl');
const SHOTS = '/tmp/ws-shots';

/** The appraisal the page holds now, without the time stamp. */
async function currentAppraisal(page: Page): Promise<Record<string, any>> {
  return page.evaluate(() => {
    const { savedAt: _ignored, ...rest } = (document.querySelector('lurk-app') as unknown as { appraisal: Record<string, unknown> }).appraisal;
    return JSON.parse(JSON.stringify(rest));
  });
}

async function addFinding(page: Page, methodTitle: string, name: string): Promise<void> {
  await page.getByLabel('Method of a new finding').selectOption({ label: methodTitle });
  await page.getByRole('button', { name: 'Add a finding' }).click();
  await page.getByLabel('Name of this finding').fill(name);
}

// Hand computations with E = RR + √(RR(RR − 1)) (VanderWeele & Ding 2017), a rare outcome taking OR and HR as RR:
// OR 2.5 (1.4–4.5) → 4.44 and 2.15; HR 1.9 (1.3–2.8) → 3.21 and 1.92.
// Cinelli & Hazlett 2020 published example: t = 4.18, df = 783 → RV 13.9%.
const EXPECTED = [
  { name: 'Stroke, odds ratio', numbers: ['4.44', '2.15'] },
  { name: 'Mortality, hazard ratio', numbers: ['3.21', '1.92'] },
  { name: 'Blood pressure, coefficient', numbers: ['13.9%'] },
];

/** Reads all three findings back in the statement and the bottom line of a page. */
async function expectAllThree(page: Page): Promise<void> {
  await page.getByRole('tab', { name: 'Robustness statement' }).click();
  const article = page.getByRole('article', { name: 'Robustness statement' });
  for (const { name, numbers } of EXPECTED) {
    const heading = article.getByRole('heading', { name, exact: true });
    await expect.poll(() => heading.count()).toBe(1);
    const paragraph = (await heading.locator('xpath=following-sibling::p[1]').textContent()) ?? '';
    for (const n of numbers) expect(paragraph, name).toContain(n);
  }
  await page.getByRole('tab', { name: 'Bottom line' }).click();
  for (const { name, numbers } of EXPECTED) {
    const part = page.getByRole('article', { name, exact: true });
    await expect.poll(() => part.count()).toBe(1);
    expect(await part.textContent(), name).toContain(numbers[0]);
  }
}

describe('an appraisal of several findings in Chromium', () => {
  let session: BrowserSession;
  let savedPath = '';
  let link = '';

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    session = await openSession({ width: 1280, height: 900 });
    session.page.on('dialog', (dialog) => void dialog.accept());
    await session.page.goto(baseUrl);
    await session.page.locator('lurk-evalue').waitFor();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('appraises three findings of different methods in one appraisal', async () => {
    const { page } = session;
    await page.getByRole('button', { name: 'Start a new appraisal' }).click();
    await expect.poll(async () => (await currentAppraisal(page)).findings.length).toBe(0);
    await page.getByLabel('Finding', { exact: true }).fill('Commuting and health (fictional paper)');

    await addFinding(page, 'Reported estimate', 'Stroke, odds ratio');
    const evalue = page.locator('lurk-evalue');
    await evalue.getByLabel('Effect measure').selectOption('or');
    await evalue.getByLabel('Estimate', { exact: true }).fill('2.5');
    await evalue.getByLabel('Lower limit').fill('1.4');
    await evalue.getByLabel('Upper limit').fill('4.5');
    await evalue.getByLabel('How common is the outcome?').selectOption('rare');
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('4.44');

    await addFinding(page, 'Reported estimate', 'Mortality, hazard ratio');
    // A new finding opens an empty calculator: nothing of the odds ratio is carried over.
    await expect.poll(() => evalue.getByLabel('Estimate', { exact: true }).inputValue()).toBe('');
    await evalue.getByLabel('Effect measure').selectOption('hr');
    await evalue.getByLabel('Estimate', { exact: true }).fill('1.9');
    await evalue.getByLabel('Lower limit').fill('1.3');
    await evalue.getByLabel('Upper limit').fill('2.8');
    await evalue.getByLabel('How common is the outcome?').selectOption('rare');
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('3.21');

    await addFinding(page, 'Regression', 'Blood pressure, coefficient');
    const ovb = page.locator('lurk-ovb');
    await ovb.getByLabel('Estimate (coefficient)').fill('4.18');
    await ovb.getByLabel('Standard error', { exact: true }).fill('1');
    await ovb.getByLabel('Degrees of freedom').fill('783');
    await expect.poll(() => ovb.locator('#rv').textContent()).toBe('13.9%');

    // Switching back to the first finding shows its own numbers.
    await page.getByRole('list', { name: 'Findings' }).getByRole('button', { name: /Stroke, odds ratio/ }).click();
    await expect.poll(() => page.getByRole('tab', { name: 'Reported estimate' }).getAttribute('aria-selected')).toBe('true');
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('4.44');

    const appraisal = await currentAppraisal(page);
    expect(appraisal.version).toBe(2);
    expect(appraisal.findings.map((f: { name: string; method: string }) => `${f.method}: ${f.name}`)).toEqual([
      'evalue: Stroke, odds ratio',
      'evalue: Mortality, hazard ratio',
      'regression: Blood pressure, coefficient',
    ]);
    await expectAllThree(page);
  });

  it('adds a finding to the batch table with one click, and opens a batch row as a finding with one click', async () => {
    const { page } = session;
    await page.getByRole('tab', { name: 'Reported estimate' }).click();
    await page.getByRole('button', { name: 'Add this finding to the batch table' }).click();
    await page.getByRole('tab', { name: 'Many findings' }).click();
    await expect.poll(() => page.locator('#batch-text').inputValue()).toContain('"Stroke, odds ratio",or,2.5,1.4,4.5');
    // The row's E-value agrees with the calculator's (4.44).
    await expect.poll(() => page.locator('lurk-batch tbody tr').first().textContent()).toContain('4.44');
    // A row typed into the table opens in its calculator as a new finding.
    const text = await page.locator('#batch-text').inputValue();
    await page.locator('#batch-text').fill(`${text}Fictional cohort F: screen time and myopia,rr,2.6,1.7,4.0,,,,,,\n`);
    await page.getByRole('button', { name: /Open row 2 \(Fictional cohort F/ }).click();
    await expect.poll(() => page.getByRole('tab', { name: 'Reported estimate' }).getAttribute('aria-selected')).toBe('true');
    // E-value of RR 2.6: 2.6 + √(2.6·1.6) = 4.64 (hand computation, VanderWeele & Ding 2017 formula)
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('4.64');
    expect((await currentAppraisal(page)).findings.at(-1).name).toBe('Fictional cohort F: screen time and myopia');
    // Remove it again: the appraisal is back to its three findings.
    await page.getByRole('button', { name: 'Remove this finding' }).click();
    await expect.poll(async () => (await currentAppraisal(page)).findings.length).toBe(3);
  });

  it('saves the appraisal as a file named after the study, and opens it again exactly', async () => {
    const { page } = session;
    const before = await currentAppraisal(page);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Save appraisal' }).click()]);
    expect(download.suggestedFilename()).toBe('lurk-commuting-and-health-fictional-paper.json');
    savedPath = artifactPath('several-findings.json');
    await download.saveAs(savedPath);
    const saved = JSON.parse(readFileSync(savedPath, 'utf8'));
    expect(saved.version).toBe(2);
    expect(saved.findings).toHaveLength(3);
    expect(saved.batch.text).toContain('Stroke, odds ratio');

    await page.getByLabel('Name of this finding').fill('Renamed by mistake');
    expect((await currentAppraisal(page)).findings[0].name).toBe('Renamed by mistake');
    await page.locator('#open-appraisal').setInputFiles(savedPath);
    await expect.poll(() => currentAppraisal(page)).toEqual(before);
    await expectAllThree(page);
    await page.getByRole('tab', { name: 'Robustness statement' }).click();
    const [statement] = await Promise.all([page.waitForEvent('download'), page.locator('lurk-statement').getByRole('button', { name: 'Download' }).click()]);
    expect(statement.suggestedFilename()).toBe('lurk-robustness-statement-commuting-and-health-fictional-paper.md');
  });

  it('shares a short link that opens all three findings in a fresh browser', async () => {
    const { page, browser } = session;
    await page.getByRole('button', { name: 'Copy share link' }).click();
    link = page.url();
    expect(link).toContain('#appraisal=2.');
    console.info(`share link of three findings and a batch row: ${link.length} characters`);
    expect(link.length).toBeLessThanOrEqual(SHARE_LINK_LIMIT);
    const other = await browser.newPage();
    await other.goto(link);
    await other.locator('lurk-app').waitFor();
    await expect.poll(async () => (await currentAppraisal(other)).findings.map((f: { name: string }) => f.name)).toEqual(EXPECTED.map((e) => e.name));
    expect((await currentAppraisal(other)).batch.text).toContain('Stroke, odds ratio');
    await expectAllThree(other);
    await other.close();
  });

  it('returns to the last tab and finding after a reload, with the batch text kept', async () => {
    const { page } = session;
    await page.getByRole('list', { name: 'Findings' }).getByRole('button', { name: /Mortality, hazard ratio/ }).click();
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('3.21');
    const before = await currentAppraisal(page);
    await page.reload();
    await page.locator('lurk-app').waitFor();
    await expect.poll(() => page.getByRole('tab', { name: 'Reported estimate' }).getAttribute('aria-selected')).toBe('true');
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('3.21');
    await expect.poll(() => page.getByLabel('Name of this finding').inputValue()).toBe('Mortality, hazard ratio');
    expect(await currentAppraisal(page)).toEqual(before);
    await page.getByRole('tab', { name: 'Many findings' }).click();
    await page.reload();
    await page.locator('lurk-app').waitFor();
    await expect.poll(() => page.getByRole('tab', { name: 'Many findings' }).getAttribute('aria-selected')).toBe('true');
    await expect.poll(() => page.locator('#batch-text').inputValue()).toContain('"Stroke, odds ratio",or,2.5');
    await expectAllThree(page);
  });

  it('says plainly when a share link would be too long for e-mail and chat', async () => {
    const { page } = session;
    await page.getByRole('tab', { name: 'Many findings' }).click();
    // Invented rows of pseudo-random numbers (they compress poorly), enough to pass the limit.
    let seed = 11;
    const random = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32).toFixed(5);
    const rows = Array.from({ length: 120 }, (_, i) => `Fictional finding ${i},rr,${(1 + Number(random())).toFixed(5)},${random()},${(2 + Number(random())).toFixed(5)}`);
    const before = await page.locator('#batch-text').inputValue();
    await page.locator('#batch-text').fill(`${before}${rows.join('\n')}\n`);
    await page.getByRole('button', { name: 'Copy share link' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Save the appraisal as a file' }).count()).toBeGreaterThan(0);
    expect(page.url().length).toBeGreaterThan(SHARE_LINK_LIMIT);
    await page.locator('#batch-text').fill(before);
  });

  it('made no request beyond its own origin, and no error', () => {
    const origin = new URL(baseUrl).origin;
    expect(session.requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'))).toEqual([]);
    expect(session.errors).toEqual([]);
  });
});

describe('the findings list, statement and bottom line look right', () => {
  for (const width of [1280, 390]) {
    it(`at ${width} px: no sideways scroll, no text under 9 px, findings buttons apart`, async () => {
      const session = await openSession({ width, height: 900 });
      try {
        const { page } = session;
        await page.goto(baseUrl);
        await page.locator('lurk-evalue').waitFor();
        const findings = page.locator('lurk-findings');
        // On a narrow screen the list starts folded, so that the calculator shows on the first screen.
        if (!(await findings.isVisible())) await page.getByText(/^Findings \(\d+\)$/).click();
        await findings.screenshot({ path: `${SHOTS}/findings-${width}.png` });
        // No field or button of the list sticks out of its box (an input inside <details> once did, by 18 px).
        const sticking = await findings.evaluate((host) => {
          const edge = host.getBoundingClientRect().right;
          return Array.from(host.shadowRoot!.querySelectorAll('input, select, button'))
            .filter((el) => el.getBoundingClientRect().right > edge + 0.5)
            .map((el) => el.id || el.textContent);
        });
        expect(sticking).toEqual([]);
        await page.screenshot({ path: `${SHOTS}/page-${width}.png`, fullPage: true });
        if (width === 1280) {
          // The fictional demo's own link (three findings; the pasted pairs stay behind, their summary travels).
          await page.getByRole('button', { name: 'Copy share link' }).click();
          await expect.poll(() => page.url()).toContain('#appraisal=2.');
          console.info(`share link of the fictional demo: ${page.url().length} characters`);
          expect(page.url().length).toBeLessThanOrEqual(SHARE_LINK_LIMIT);
        }
        for (const [tab, file] of [['Robustness statement', 'statement'], ['Bottom line', 'bottom-line']]) {
          await page.getByRole('tab', { name: tab }).click();
          await page.waitForTimeout(300);
          await page.screenshot({ path: `${SHOTS}/${file}-${width}.png`, fullPage: true });
          // The panel's first screenful, at full resolution, for a close look.
          await page.locator(`#panel-${file}`).evaluate((panel) => panel.scrollIntoView());
          await page.screenshot({ path: `${SHOTS}/${file}-${width}-top.png` });
          const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
          expect(overflow, tab).toBeLessThanOrEqual(0);
          const smallest = await page.evaluate(() => {
            let min = Infinity;
            const visit = (root: Document | ShadowRoot) => {
              for (const el of Array.from(root.querySelectorAll('*'))) {
                if (el.shadowRoot) visit(el.shadowRoot);
                const box = el.getBoundingClientRect();
                const hasText = Array.from(el.childNodes).some((n) => n.nodeType === 3 && (n.textContent ?? '').trim() !== '');
                if (hasText && box.width > 0 && box.height > 0) min = Math.min(min, parseFloat(getComputedStyle(el).fontSize));
              }
            };
            visit(document);
            return min;
          });
          expect(smallest, tab).toBeGreaterThanOrEqual(9);
        }
        const boxes = await findings.getByRole('list', { name: 'Findings' }).getByRole('button').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON()));
        for (let i = 0; i < boxes.length; i++)
          for (let j = i + 1; j < boxes.length; j++) {
            const [a, b] = [boxes[i], boxes[j]];
            const apart = a.right <= b.left || b.right <= a.left || a.bottom <= b.top || b.bottom <= a.top;
            expect(apart, `finding buttons ${i} and ${j}`).toBe(true);
          }
      } finally {
        await session.close();
      }
    }, 120_000);
  }
});
