import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import type { CommandFigure, CommandReport } from '../methodModule';
import { jsonReading } from '../jsonReading';
import { setsAmplificationPlot, setsEstimatePlot, setsPValuePlot } from './plots';
import { SETS_CAUTION, setsReading, setsReportText, setsResultJson } from './text';

/** The figures of `lurk sets --svg NAME`, in the page's order. */
export const SETS_FIGURES: readonly CommandFigure[] = Object.freeze([
  { name: 'p-value', shows: 'the worst-case and best-case p-values against Γ, with α and the tipping Γ' },
  { name: 'estimate', shows: 'the m-estimate’s range and sensitivity interval against Γ', absentWhen: 'the outcome is 0/1, since the test then counts events and gives no estimate' },
  { name: 'amplification', shows: 'the ways (Λ, Δ) a hidden covariate could produce the tipping Γ', absentWhen: 'there is no tipping Γ' },
]);

/**
 * The command's report of a matched-sets result: the text for people (the reader's notes first, e.g. padded
 * short rows), the JSON object (the result's fields, the reading, every warning, and the caution), shaped as
 * `lurk pairs`'s, and the figures.
 */
export function setsReport(result: MatchedSetsResult, readWarnings: readonly string[] = []): CommandReport {
  const json = setsResultJson(result);
  json.warnings = [...readWarnings, ...result.warnings];
  json.reading = jsonReading(setsReading(result));
  json.caution = SETS_CAUTION;
  const text = readWarnings.map((w) => `Note: ${w}\n`).join('') + setsReportText(result);
  const figures = {
    'p-value': () => setsPValuePlot(result),
    estimate: () => setsEstimatePlot(result),
    amplification: () => setsAmplificationPlot(result),
  };
  return Object.freeze({ text, json, figures });
}
