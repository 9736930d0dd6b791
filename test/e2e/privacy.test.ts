import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { artifactPath, openSession, type BrowserSession } from '../support/browserSession';

// The page must make no request beyond its own origin: the data never leave the machine.
describe('the built app in Chromium', () => {
  let session: BrowserSession;
  const baseUrl = inject('baseUrl');

  beforeAll(async () => {
    session = await openSession();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('opens with the fictional demo and no page errors', async () => {
    await session.page.goto(baseUrl);
    await session.page.waitForSelector('lurk-app');
    await expect.poll(() => session.page.locator('lurk-app').getByText('Fictional demo').count()).toBeGreaterThan(0);
    await session.page.screenshot({ path: artifactPath('app-1280.png'), fullPage: true });
    expect(session.errors).toEqual([]);
  });

  it('serves a Content-Security-Policy that allows no outside connections', async () => {
    const csp = await session.page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("connect-src 'self'");
    expect(csp).not.toMatch(/https?:|\*/);
  });

  it('made no request outside its own origin', () => {
    const origin = new URL(baseUrl).origin;
    const outside = session.requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'));
    expect(outside).toEqual([]);
    expect(session.requests.length).toBeGreaterThan(0);
  });
});
