import { chromium, type Browser, type Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chromiumArgs, chromiumPath } from './chromium';

/** A page in Debian's Chromium that records every request it makes (to prove nothing leaves the origin). */
export interface BrowserSession {
  browser: Browser;
  page: Page;
  /** Every URL the page requested, in order. */
  requests: string[];
  /** Console errors and uncaught page errors. */
  errors: string[];
  close(): Promise<void>;
}

export async function openSession(options: { width?: number; height?: number } = {}): Promise<BrowserSession> {
  const browser = await chromium.launch({ executablePath: chromiumPath, args: chromiumArgs, headless: true });
  const context = await browser.newContext({
    viewport: { width: options.width ?? 1280, height: options.height ?? 900 },
    acceptDownloads: true,
  });
  const page = await context.newPage();
  const requests: string[] = [];
  const errors: string[] = [];
  page.on('request', (request) => requests.push(request.url()));
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(message.text());
  });
  page.on('pageerror', (error) => errors.push(error.message));
  return {
    browser,
    page,
    requests,
    errors,
    close: () => browser.close(),
  };
}

/** Where screenshots go (git-ignored): look at them after a run. */
export function artifactPath(name: string): string {
  const dir = fileURLToPath(new URL('../artifacts/', import.meta.url));
  mkdirSync(dir, { recursive: true });
  return dir + name;
}
