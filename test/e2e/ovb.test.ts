import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { referencePath } from '../support/reference';
import { artifactPath, openSession, type BrowserSession } from '../support/browserSession';

const baseUrl = inject('baseUrl');

describe('the regression calculator in the built app', () => {
  let session: BrowserSession;

  beforeAll(async () => {
    session = await openSession({ width: 1280, height: 900 });
    await session.page.goto(baseUrl);
    await session.page.locator('lurk-app').waitFor();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('fits a CSV in the bundled Web Worker and shows the robustness values, with no request leaving the page', async () => {
    const { page } = session;
    await page.getByRole('tab', { name: 'Regression' }).click();
    const panel = page.locator('lurk-ovb');
    await panel.getByLabel('A CSV file of the data').check();
    // R's datasets::swiss (an open reference data set), test/reference/swiss.csv
    await panel.getByLabel('CSV file', { exact: true }).setInputFiles(referencePath('swiss.csv'));
    await panel.getByLabel('Outcome', { exact: true }).selectOption('Fertility');
    await panel.getByLabel('Treatment (exposure)').selectOption('Education');
    await panel.getByRole('button', { name: 'Fit the regression' }).click();
    // R 4.2.2 lm on swiss (test/reference/ovb.json): RV 51.7%, RV at α = 0.05 34.3%
    await expect.poll(() => panel.locator('#rv').textContent(), { timeout: 20_000 }).toBe('51.7%');
    expect(await panel.locator('#rv-alpha').textContent()).toBe('34.3%');
    expect(await panel.locator('#benchmarks tbody tr').count()).toBe(12);
    await page.screenshot({ path: artifactPath('ovb-app-1280.png'), fullPage: true });
    const origin = new URL(baseUrl).origin;
    expect(session.requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'))).toEqual([]);
    expect(session.errors).toEqual([]);
  });
});
