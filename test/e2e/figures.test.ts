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

/**
 * The demo with a crowded regression (twenty close covariates), many reference confounders, and matched-sets and
 * weighting findings on invented files with many Γ and Λ values (all made up).
 */
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
    // Matched sets and weighting read files: their findings name the columns, and the files are chosen below.
    const gammas = Array.from({ length: 25 }, (_, i) => (1 + i * 0.04).toFixed(2)).join(', ');
    appraisal.findings.push(
      { id: 'f91', method: 'sets', name: 'Blood pressure, matched sets', inputs: { setColumn: 'matched_set', treatedColumn: 'cycles', outcomeColumn: 'bp', alternative: 'less', gammas }, summary: null },
      { id: 'f92', method: 'weighting', name: 'Blood pressure, weighting', inputs: { treatment: 'cycles', outcome: 'bp', covariates: 'age, income', lambdas: '1, 1.1, 1.2, 1.3, 1.4, 1.5, 1.6, 1.8, 2, 2.5, 3', bootstrap: '100' }, summary: null },
    );
    app.load(appraisal);
  });
  for (const [tag, name, text] of [
    ['lurk-sets', 'sets-fictional.csv', setsCsv()],
    ['lurk-weighting', 'weighting-fictional.csv', weightingCsv()],
  ] as const) {
    await page.locator(tag).getByLabel('CSV file', { exact: true }).setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text) });
    await page.waitForFunction((t) => !!document.querySelector('lurk-app')?.shadowRoot?.querySelector(t)?.shadowRoot?.querySelector('#bounds-table tbody tr'), tag, { timeout: 60_000 });
  }
}

/** A fixed stream of numbers in [0, 1) for the invented files (linear congruential). */
function stream(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1103515245) + 12345) >>> 0;
    return state / 4294967296;
  };
}

/** Fictional matched sets: one cyclist and one to four drivers each, blood pressure a little lower for cyclists. */
function setsCsv(): string {
  const next = stream(5);
  const normal = () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
  const rows = ['matched_set,cycles,bp'];
  for (let s = 1; s <= 150; s++) {
    const level = 132 + 10 * normal();
    rows.push(`set${s},1,${(level - 5 + 8 * normal()).toFixed(1)}`);
    for (let c = 0, n = 1 + Math.floor(next() * 4); c < n; c++) rows.push(`set${s},0,${(level + 8 * normal()).toFixed(1)}`);
  }
  return rows.join('\n') + '\n';
}

/** Fictional people: whether they cycle to work (0/1), blood pressure, age and income. */
function weightingCsv(): string {
  const next = stream(6);
  const normal = () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
  const rows = ['cycles,bp,age,income'];
  for (let i = 0; i < 400; i++) {
    const age = 25 + 40 * next();
    const income = 30 + 40 * next();
    const cycles = next() < 1 / (1 + Math.exp(0.04 * (age - 45) - 0.03 * (income - 50))) ? 1 : 0;
    rows.push(`${cycles},${(112 + 0.45 * age - 0.1 * income - 5 * cycles + 8 * normal()).toFixed(1)},${age.toFixed(1)},${income.toFixed(1)}`);
  }
  return rows.join('\n') + '\n';
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
