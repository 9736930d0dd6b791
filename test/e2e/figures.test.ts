import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, openSession, type BrowserSession } from '../support/browserSession';

const baseUrl = inject('baseUrl');

interface FigureCheck {
  id: string;
  texts: number;
  clashes: string[];
  smallest: number;
}

/** Every visible figure on the page (through the shadow roots): real text boxes, their overlaps and sizes. */
async function checkFigures(page: Page): Promise<{ figures: FigureCheck[]; scrollWidth: number; innerWidth: number }> {
  return page.evaluate(() => {
    const plots: Element[] = [];
    const walk = (root: Document | ShadowRoot) => {
      for (const el of root.querySelectorAll('*')) {
        if (el.tagName === 'LURK-PLOT') plots.push(el);
        if (el.shadowRoot) walk(el.shadowRoot);
      }
    };
    walk(document);
    const figures = plots
      .map((plot) => plot.shadowRoot?.querySelector('svg'))
      .filter((svg): svg is SVGSVGElement => !!svg && svg.getBoundingClientRect().width > 0)
      .map((svg) => {
        const scale = svg.getBoundingClientRect().width / svg.viewBox.baseVal.width;
        const boxes = [...svg.querySelectorAll('text')].map((t) => {
          const r = t.getBoundingClientRect();
          return { text: t.textContent ?? '', left: r.left, right: r.right, top: r.top, bottom: r.bottom, size: Number.parseFloat(getComputedStyle(t).fontSize) * scale };
        });
        const clashes: string[] = [];
        for (let i = 0; i < boxes.length; i++) {
          for (let j = i + 1; j < boxes.length; j++) {
            const [a, b] = [boxes[i], boxes[j]];
            if (a.left < b.right - 0.5 && b.left < a.right - 0.5 && a.top < b.bottom - 0.5 && b.top < a.bottom - 0.5) clashes.push(`"${a.text}" × "${b.text}"`);
          }
        }
        return { id: svg.getAttribute('aria-labelledby') ?? '', texts: boxes.length, clashes, smallest: Math.min(...boxes.map((b) => b.size)) };
      });
    return { figures, scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth };
  });
}

/** Opens every tab in turn; after each, checks the figures and the page width and saves a screenshot. */
async function visitEveryTab(page: Page, label: string): Promise<number> {
  const tabs = page.getByRole('tab');
  const count = await tabs.count();
  let figures = 0;
  for (let i = 0; i < count; i++) {
    const tab = tabs.nth(i);
    const name = ((await tab.textContent()) ?? `tab-${i}`).trim();
    await tab.click();
    await page.waitForTimeout(1200);
    const check = await checkFigures(page);
    for (const f of check.figures) {
      expect(f.clashes, `${label} ${name} ${f.id}`).toEqual([]);
      expect(f.smallest, `${label} ${name} ${f.id}`).toBeGreaterThanOrEqual(9);
    }
    expect(check.scrollWidth, `${label} ${name}: the page scrolls sideways`).toBeLessThanOrEqual(check.innerWidth);
    figures += check.figures.length;
    await page.screenshot({ path: artifactPath(`figures-${label}-${name.replace(/\W+/g, '-').toLowerCase()}.png`), fullPage: true });
  }
  return figures;
}

/** The demo with a crowded regression (twenty close covariates) and many reference confounders (made up). */
async function loadCrowded(page: Page): Promise<void> {
  await page.evaluate(() => {
    const app = document.querySelector('lurk-app') as unknown as { appraisal: any; load(a: any): void };
    const appraisal = JSON.parse(JSON.stringify(app.appraisal));
    const regression = appraisal.findings.find((f: { method: string }) => f.method === 'regression');
    regression.inputs.covariateTs = Array.from({ length: 20 }, (_, i) => ({ name: `household income band ${i + 1}`, outcomeT: (2 + 0.05 * i).toFixed(2), treatmentT: (-1.5 - 0.03 * i).toFixed(2) }));
    regression.summary = null;
    const evalue = appraisal.findings.find((f: { method: string }) => f.method === 'evalue');
    evalue.inputs.confounders = Array.from({ length: 12 }, (_, i) => ({ name: `deprivation quintile ${i + 1}`, rrExposure: (1.5 + 0.01 * i).toFixed(2), rrOutcome: (1.6 + 0.01 * i).toFixed(2) }));
    evalue.summary = null;
    app.load(appraisal);
  });
}

for (const width of [1280, 390]) {
  describe(`every figure of every tab at ${width} px`, () => {
    let session: BrowserSession;
    beforeAll(async () => {
      session = await openSession({ width, height: width > 500 ? 900 : 844 });
      await session.page.goto(baseUrl);
      await session.page.locator('lurk-evalue').waitFor();
    });
    afterAll(async () => {
      await session?.close();
    });

    it('the demo: no text over text, figure text ≥ 9 CSS px, no sideways page scroll', async () => {
      const figures = await visitEveryTab(session.page, `demo-${width}`);
      expect(figures).toBeGreaterThanOrEqual(7);
    });

    it('crowded cases: the same', async () => {
      await loadCrowded(session.page);
      await visitEveryTab(session.page, `crowded-${width}`);
    });

    if (width < 500) {
      it('the first screen shows the calculator, not only the study header', async () => {
        const { page } = session;
        await page.getByRole('tab').first().click();
        await page.evaluate(() => window.scrollTo(0, 0));
        const top = await page.evaluate(() => {
          const app = document.querySelector('lurk-app')!;
          const calculator = app.shadowRoot!.querySelector('[role=tabpanel]:not([hidden]) [data-calculator]') as HTMLElement;
          return calculator.getBoundingClientRect().top;
        });
        expect(top).toBeLessThan(844 * 0.75);
      });
    }
  });
}
