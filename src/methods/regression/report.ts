import type { OvbResult } from '../../core/ovbAnalysis';
import type { StudyLabels } from '../../format/studyLabels';
import type { CommandFigure, CommandReport } from '../methodModule';
import type { RegressionData } from './regressionData';
import { ovbJson, ovbReport } from './text';
import { ovbContourPlot } from './ovbContourPlot';
import { ovbExtremeScenarioPlot } from './ovbExtremeScenarioPlot';

/** Where the regression's numbers came from, for the report's data line and the JSON's extra fields. */
export type OvbDataOrigin =
  | { readonly kind: 'reported'; readonly typed?: { readonly estimate: string; readonly se: string } }
  | { readonly kind: 'file'; readonly path: string; readonly data: RegressionData }
  | { readonly kind: 'summary'; readonly path: string; readonly n: number; readonly outcome: string; readonly treatment: string; readonly covariates: readonly string[] };

/** The figures of `lurk ovb --svg NAME`, in the page's order. */
export const OVB_FIGURES: readonly CommandFigure[] = Object.freeze([
  { name: 'estimate', shows: 'contours of the adjusted estimate by the confounder’s partial R² with treatment and outcome' },
  { name: 't', shows: 'contours of the adjusted t-statistic, with the significance threshold' },
  { name: 'extreme', shows: 'the adjusted estimate if the confounder explained much of the outcome (extreme scenarios)' },
]);

/**
 * The report of an analysis: the text for people, the JSON object (every field of the command's JSON) and the
 * figures (with the data's columns as labels). `settings` are q and α as typed, echoed with the precision typed.
 */
export function ovbCommandReport(result: OvbResult, origin: OvbDataOrigin, settings: { readonly q?: string; readonly alpha?: string } = {}): CommandReport {
  const { dataNote, study, extra } = describeOrigin(origin);
  const typed = { ...(origin.kind === 'reported' ? origin.typed : {}), ...settings };
  const figures = {
    estimate: () => ovbContourPlot(result, { kind: 'estimate', study }),
    t: () => ovbContourPlot(result, { kind: 't', study }),
    extreme: () => ovbExtremeScenarioPlot(result, { study }),
  };
  return { text: ovbReport(result, { dataNote, study, typed }), json: JSON.parse(ovbJson(result, extra)) as unknown, figures };
}

/** The summary-statistics query to run in a database, as text and as JSON. */
export function ovbSqlReport(query: string, columns: { table: string; outcome: string; treatment: string; covariates: readonly string[] }): CommandReport {
  return { text: query.endsWith('\n') ? query : query + '\n', json: { query, ...columns, covariates: [...columns.covariates] } };
}

function describeOrigin(origin: OvbDataOrigin): { dataNote?: string; study: Pick<StudyLabels, 'exposure' | 'outcome'>; extra: Record<string, unknown> } {
  if (origin.kind === 'file') {
    const data = origin.data;
    let dataNote =
      `Data: ${origin.path}, ${data.rowsUsed} rows used of ${data.rowsRead}` +
      (data.rowsDropped > 0 ? ` (${data.rowsDropped} dropped for a missing value)` : '') +
      `; outcome ${data.outcome}, treatment ${data.treatment}, covariates ${data.covariates.join(', ') || 'none'}.` +
      data.categorical.map((c) => `\n${c.column} is categorical: reference level "${c.reference}".`).join('');
    for (const w of data.warnings) dataNote += `\nNote: ${w}`;
    return {
      dataNote,
      study: { exposure: data.treatment, outcome: data.outcome },
      extra: { rowsRead: data.rowsRead, rowsUsed: data.rowsUsed, rowsDropped: data.rowsDropped, outcome: data.outcome, treatment: data.treatment, covariates: data.covariates },
    };
  }
  if (origin.kind === 'summary') {
    return {
      dataNote: `Summary statistics: ${origin.path}, n = ${origin.n}; outcome ${origin.outcome}, treatment ${origin.treatment}, covariates ${origin.covariates.join(', ')}.`,
      study: { exposure: origin.treatment, outcome: origin.outcome },
      extra: { rowsUsed: origin.n, outcome: origin.outcome, treatment: origin.treatment, covariates: origin.covariates },
    };
  }
  return { study: { exposure: 'the treatment', outcome: 'the outcome' }, extra: {} };
}
