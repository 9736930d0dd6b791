import { describe, expect, it } from 'vitest';
import { eValueHistogram } from '../../src/workspace/batchHistogram';
import { renderSvgString } from '../../src/plot/svgString';

describe('eValueHistogram', () => {
  it('counts every E-value exactly once, the value 1 included', () => {
    const values = [1, 1, 1.5, 2.2, 3.9, 7.26, 12, 40, null, NaN];
    const spec = eValueHistogram(values);
    const total = spec.table.rows.reduce((sum, row) => sum + Number(row[2]), 0);
    expect(total).toBe(8);
    expect(renderSvgString(spec)).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('draws an empty set without failing', () => {
    const spec = eValueHistogram([]);
    expect(spec.marks).toHaveLength(0);
    expect(renderSvgString(spec)).not.toMatch(/NaN|Infinity/);
  });
});
