import { describe, expect, test } from 'vitest';
import { figureCaption, figureCsv } from '../../src/plot/figureCaption';
import { layoutFigure } from '../../src/plot/figureLayout';
import { screenLayout } from '../../src/plot/printSize';
import { figureCases } from '../support/figureCases';

const cases = figureCases();

describe('figureCaption and figureCsv', () => {
  test('the caption names the figure, says what it shows and where its data are', () => {
    const { spec } = cases.find((c) => c.name === 'evalue demo')!;
    const caption = figureCaption(spec);
    expect(caption.startsWith(`${spec.title}.`)).toBe(true);
    expect(caption).toContain(spec.description);
    expect(caption).toContain(`lurk-${spec.id}.csv`);
    expect(caption.endsWith('\n')).toBe(true);
  });

  test('a crowded figure’s caption carries its numbered key', () => {
    const { spec } = cases.find((c) => c.name === 'regression estimate crowded')!;
    const layout = layoutFigure(spec, screenLayout(350));
    expect(layout.keyEntries.length).toBeGreaterThan(0);
    expect(figureCaption(spec, layout)).toContain(layout.keyEntries[0]);
  });

  test('the CSV has the table’s header and one line per row, CRLF line ends (RFC 4180)', () => {
    for (const { spec } of cases) {
      const lines = figureCsv(spec).split('\r\n');
      expect(lines[0].split(',').length).toBeGreaterThanOrEqual(spec.table.columns.length);
      expect(lines).toHaveLength(spec.table.rows.length + 2);
      expect(figureCsv(spec)).not.toMatch(/NaN|undefined|Infinity/);
    }
  });
});
