// Start-up safety of the built page: a share link carrying a billion discordant pairs opens and answers, and so
// does the plain address afterwards (the work kept from it); a share link never replaces work in progress without
// asking (the replaced work is kept under "Recent appraisals"), also when pasted into an open tab; a visit that
// did not finish drawing opens the next time with the saved work not computed, and a button computes it. No
// Content Security Policy violation is reported along the way.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openSession, type BrowserSession } from '../support/browserSession';
import { createAppraisal } from '../../src/workspace/appraisal';
import { encodeShareFragment } from '../../src/workspace/shareLink';

const baseUrl = inject('baseUrl');
const study = (finding: string) => ({ finding, exposure: 'the treatment', outcome: 'the event', units: '', source: 'Invented for this test (fictional).' });
const heavy = encodeShareFragment(
  createAppraisal(study('Fictional billion pairs'), { pairs: { inputs: { source: 'discordant', treatedOnly: '1e9', controlOnly: '999e6' }, summary: null } }),
);
const other = encodeShareFragment(
  createAppraisal(study('Fictional other finding'), { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' }, summary: null } }),
);

describe('start-up safety of the page', () => {
  let session: BrowserSession;
  const cspViolations: string[] = [];

  beforeAll(async () => {
    session = await openSession({ width: 1280, height: 900 });
    session.page.on('console', (message) => {
      if (/Content Security Policy/i.test(message.text())) cspViolations.push(message.text());
    });
  });
  afterAll(async () => {
    await session?.close();
  });

  it('opens a share link with discordant counts 1e9 and 999e6, then the plain address, and answers each time', async () => {
    const { page } = session;
    await page.goto(baseUrl + heavy);
    await page.getByRole('tab', { name: 'Matched pairs' }).click();
    // Sign test on 1e9 vs 999e6 discordant pairs: p far below 0.05 at Γ = 1, tipping Γ just above 1.
    await expect.poll(() => page.locator('lurk-pairs #tipping-gamma').textContent(), { timeout: 10_000 }).toMatch(/^1\.00\d$/);
    expect(new URL(page.url()).hash).toBe('');
    await page.goto(baseUrl);
    await page.getByRole('tab', { name: 'Matched pairs' }).click();
    await expect.poll(() => page.locator('lurk-pairs #tipping-gamma').textContent(), { timeout: 10_000 }).toMatch(/^1\.00\d$/);
    expect(await page.evaluate(() => localStorage.getItem('lurk.drawing'))).toBeNull();
  });

  it('asks before a share link replaces the work in progress, and keeps the replaced work under Recent appraisals', async () => {
    const { page } = session;
    await page.goto(baseUrl + other);
    const dialog = page.getByRole('alertdialog');
    await expect.poll(() => dialog.textContent()).toContain('Fictional other finding');
    expect(await dialog.textContent()).toContain('Fictional billion pairs');
    await dialog.getByRole('button', { name: 'Open the shared appraisal' }).click();
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('7.26');
    await expect.poll(() => page.locator('.recent-appraisals summary').textContent()).toBe('Recent appraisals (1)');
  });

  it('a share link pasted into the open tab asks the same way', async () => {
    const { page } = session;
    await page.evaluate((hash) => {
      location.hash = hash;
    }, heavy);
    const dialog = page.getByRole('alertdialog');
    await expect.poll(() => dialog.textContent()).toContain('Fictional billion pairs');
    await dialog.getByRole('button', { name: 'Keep my work' }).click();
    expect(await page.locator('#evalue-estimate').textContent()).toBe('7.26');
  });

  it('after a visit that did not finish drawing, opens the saved work not computed and computes it on request', async () => {
    const { page } = session;
    await page.evaluate(() => localStorage.setItem('lurk.drawing', new Date().toISOString()));
    await page.goto(baseUrl);
    const notice = page.getByRole('alertdialog');
    await expect.poll(() => notice.textContent()).toContain('not computed yet');
    expect(await page.locator('#evalue-estimate').count()).toBe(0);
    await notice.getByRole('button', { name: 'Compute the saved work' }).click();
    await expect.poll(() => page.locator('#evalue-estimate').textContent()).toBe('7.26');
    expect(cspViolations).toEqual([]);
  });
});
