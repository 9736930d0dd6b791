import { afterEach, describe, expect, it } from 'vitest';
import { page } from 'vitest/browser';
import '../../components/lurk-plot';
import type { LurkPlot } from '../../components/lurk-plot';
import { figurePngBlob, figureSvgBlob } from '../../src/plot/figureExport.browser';
import { readPngDpi } from '../../src/plot/pngDpi';
import { figureCases } from '../support/figureCases';

const cases = figureCases();
let holder: HTMLDivElement | null = null;
afterEach(() => {
  holder?.remove();
  holder = null;
});

/** Real text boxes of a drawn figure, in CSS pixels of the page. */
function drawnTextBoxes(svg: SVGSVGElement) {
  return [...svg.querySelectorAll('text')].map((t) => {
    const r = t.getBoundingClientRect();
    const size = Number.parseFloat(getComputedStyle(t).fontSize) * (svg.getBoundingClientRect().width / svg.viewBox.baseVal.width);
    return { text: t.textContent ?? '', left: r.left, right: r.right, top: r.top, bottom: r.bottom, size };
  });
}

function clashes(boxes: ReturnType<typeof drawnTextBoxes>): string[] {
  const out: string[] = [];
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const [a, b] = [boxes[i], boxes[j]];
      // half a pixel of tolerance for anti-aliased glyph edges
      if (a.left < b.right - 0.5 && b.left < a.right - 0.5 && a.top < b.bottom - 0.5 && b.top < a.bottom - 0.5) out.push(`"${a.text}" × "${b.text}"`);
    }
  }
  return out;
}

async function mountPlot(spec: (typeof cases)[number]['spec'], viewportWidth: number): Promise<SVGSVGElement> {
  await page.viewport(viewportWidth, 900);
  holder = document.createElement('div');
  holder.style.cssText = 'padding: 0 16px; box-sizing: border-box; width: 100%';
  const plot = document.createElement('lurk-plot') as LurkPlot;
  plot.spec = spec;
  holder.append(plot);
  document.body.append(holder);
  await plot.updateComplete;
  // the ResizeObserver lays the figure out again at its real width
  await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
  await plot.updateComplete;
  return plot.shadowRoot!.querySelector('svg') as SVGSVGElement;
}

describe('figures drawn in Chromium', () => {
  for (const width of [1280, 390]) {
    it.each(cases.map((c) => [c.name, c.spec] as const))(`%s at ${width} px: no text over text, text ≥ 9 CSS px, no sideways page scroll`, async (_name, spec) => {
      const svg = await mountPlot(spec, width);
      const boxes = drawnTextBoxes(svg);
      expect(boxes.length).toBeGreaterThan(4);
      expect(clashes(boxes)).toEqual([]);
      expect(Math.min(...boxes.map((b) => b.size))).toBeGreaterThanOrEqual(9);
      expect(document.documentElement.scrollWidth).toBeLessThanOrEqual(window.innerWidth);
      const drawn = svg.getBoundingClientRect().width;
      expect(drawn).toBeLessThanOrEqual(width);
    });
  }
});

describe('figure export', () => {
  const spec = cases[0].spec;

  it('SVG files are sized in inches with a viewBox in points', async () => {
    const one = await figureSvgBlob(spec, 'column').text();
    expect(one).toMatch(/^<svg[^>]* viewBox="0 0 252 [\d.]+" width="3.5in" height="[\d.]+in"/);
    const two = await figureSvgBlob(spec, 'two-columns').text();
    expect(two).toMatch(/^<svg[^>]* viewBox="0 0 504 [\d.]+" width="7in"/);
  });

  it('PNG files carry their resolution (pHYs) and have the pixels for it', async () => {
    for (const [print, dpi, pixels] of [
      ['column', 300, 1050],
      ['column', 600, 2100],
      ['two-columns', 300, 2100],
    ] as const) {
      const bytes = new Uint8Array(await (await figurePngBlob(spec, print, dpi)).arrayBuffer());
      expect(readPngDpi(bytes)).toBe(dpi);
      // IHDR width: bytes 16–19 (PNG specification, §11.2.2)
      expect(new DataView(bytes.buffer).getUint32(16)).toBe(pixels);
    }
  });
});
