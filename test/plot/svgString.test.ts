import { describe, expect, it } from 'vitest';
import { createFrame } from '../../src/plot/frame';
import { renderSvgString, renderedHeight } from '../../src/plot/svgString';
import { invertAxis } from '../../src/plot/invertAxis';
import { polylinePath } from '../../src/plot/pathData';
import type { PlotSpec } from '../../src/plot/plotSpec';
import { readPngDpi, setPngDpi } from '../../src/plot/pngDpi';

function sampleSpec(): PlotSpec {
  const frame = createFrame({ width: 480, height: 320, x: { domain: [1, 100], label: 'x <log>', scale: 'log' }, y: { domain: [0, 1], label: 'y & co' } });
  return {
    id: 'sample',
    title: 'A "sample" plot',
    description: 'Shows escaping.',
    width: frame.width,
    height: frame.height,
    xAxis: frame.xAxis,
    yAxis: frame.yAxis,
    inner: frame.inner,
    marks: [
      { kind: 'path', d: polylinePath([[frame.x(1), frame.y(0)], [frame.x(NaN), frame.y(0.5)], [frame.x(100), frame.y(1)]]), stroke: '#000' },
      { kind: 'point', x: frame.x(10), y: frame.y(0.5), shape: 'diamond', color: '#0072B2', label: 'age <65' },
    ],
    legend: [{ label: 'estimate', color: '#0072B2', swatch: 'line' }],
    table: { caption: 'data', columns: ['x', 'y'], rows: [['1', '0']] },
  };
}

describe('createFrame', () => {
  it('maps the domain ends to the plotting area and inverts back', () => {
    const frame = createFrame({ width: 400, height: 300, x: { domain: [1, 10], label: 'x', scale: 'log' }, y: { domain: [-1, 1], label: 'y' } });
    expect(frame.x(1)).toBeCloseTo(frame.inner.left, 9);
    expect(frame.x(10)).toBeCloseTo(frame.inner.right, 9);
    expect(frame.y(1)).toBeCloseTo(frame.inner.top, 9);
    expect(invertAxis(frame.xAxis, frame.x(3.7))).toBeCloseTo(3.7, 9);
    expect(invertAxis(frame.yAxis, frame.y(0.25))).toBeCloseTo(0.25, 9);
  });

  it('gives round tick values with labels that never read NaN', () => {
    const frame = createFrame({ width: 400, height: 300, x: { domain: [0, 0.3], label: 'x' }, y: { domain: [NaN, Infinity], label: 'y' } });
    expect(frame.xAxis.ticks.map((t) => t.label)).toContain('0.1');
    for (const t of [...frame.xAxis.ticks, ...frame.yAxis.ticks]) expect(t.label).not.toMatch(/NaN|Infinity/);
  });
});

describe('renderSvgString', () => {
  it('escapes all text and breaks lines at non-finite points', () => {
    const svg = renderSvgString(sampleSpec());
    expect(svg).toContain('A &quot;sample&quot; plot');
    expect(svg).toContain('age &lt;65');
    expect(svg).toContain('y &amp; co');
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
  });

  it('makes room for the legend and the optional title', () => {
    const spec = sampleSpec();
    expect(renderedHeight(spec)).toBeGreaterThan(spec.height);
    expect(renderedHeight(spec, { includeTitle: true })).toBeGreaterThan(renderedHeight(spec) + 12);
  });
});

describe('setPngDpi', () => {
  // The smallest valid PNG (1×1 grey pixel), bytes per the PNG specification (W3C 2003): signature, IHDR, IDAT, IEND.
  const tinyPng = Uint8Array.from(
    atob('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAAAAAA6fptVAAAACklEQVQI12NgAAAAAgAB4iG8MwAAAABJRU5ErkJggg=='),
    (c) => c.charCodeAt(0),
  );

  it('writes 300 dpi into a PNG that had no resolution, and replaces an existing one', () => {
    expect(readPngDpi(tinyPng)).toBeNull();
    const marked = setPngDpi(tinyPng, 300);
    expect(readPngDpi(marked)).toBe(300);
    const again = setPngDpi(marked, 600);
    expect(readPngDpi(again)).toBe(600);
    expect(again.length).toBe(marked.length);
  });

  it('refuses bytes that are not a PNG', () => {
    expect(() => setPngDpi(new Uint8Array(20), 300)).toThrow(/not a PNG/);
  });
});
