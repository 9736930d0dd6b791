import type { PlotSpec } from './plotSpec';
import type { FigureLayout } from './figureLayout';
import { toSafeCsv } from '../format/csvExport';

/**
 * The caption that travels with an exported figure: its title, what it shows, the numbered key (when labels
 * were crowded into numbers), notes drawn above the plot, and a pointer to the data table.
 */
export function figureCaption(spec: PlotSpec, layout?: FigureLayout): string {
  const parts = [`${spec.title}.`, spec.description];
  if (layout && layout.notes.length > 0) parts.push(layout.notes.map((n) => `${n}.`).join(' '));
  if (layout && layout.keyEntries.length > 0) parts.push(`Numbered points: ${layout.keyEntries.join('; ')}.`);
  parts.push(`Data: ${spec.table.caption} (file lurk-${spec.id}.csv).`);
  return parts.join(' ').replace(/\.\./g, '.') + '\n';
}

/** The figure's data table as spreadsheet-safe CSV (see toSafeCsv). */
export function figureCsv(spec: PlotSpec): string {
  return toSafeCsv(spec.table.columns, spec.table.rows);
}
