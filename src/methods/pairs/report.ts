import type { PairsResult } from '../../core/pairsAnalysis';
import type { CommandFigure, CommandReport } from '../methodModule';
import { jsonReading } from '../jsonReading';
import { amplificationPlot } from './amplificationPlot';
import { estimateRangePlot } from './estimateRangePlot';
import { pValueByGammaPlot } from './pValueByGammaPlot';
import { PAIRS_CAUTION, pairsReading, pairsReportText, pairsResultJson } from './text';

/** The figures of `lurk pairs --svg NAME`, in the page's order. */
export const PAIRS_FIGURES: readonly CommandFigure[] = Object.freeze([
  { name: 'p-value', shows: 'the worst-case and best-case p-values against Γ, with α and the tipping Γ' },
  { name: 'estimate', shows: 'the Hodges–Lehmann estimate’s range and sensitivity interval against Γ', absentWhen: 'there is no estimate, as with the sign test, discordant counts or a summary row' },
  { name: 'amplification', shows: 'the ways (Λ, Δ) a hidden covariate could produce the tipping Γ', absentWhen: 'there is no tipping Γ' },
]);

/**
 * The command's report of a matched-pairs result: the text for people (the reader's notes first, e.g. rows left
 * out for a missing value), the JSON object (the result's fields, the reading, every warning, and the caution)
 * and the figures.
 */
export function pairsReport(result: PairsResult, readWarnings: readonly string[] = [], typedAlpha?: string): CommandReport {
  const json = pairsResultJson(result);
  json.warnings = [...readWarnings, ...result.warnings];
  json.reading = jsonReading(pairsReading(result, undefined, typedAlpha));
  json.caution = PAIRS_CAUTION;
  const text = readWarnings.map((w) => `Note: ${w}\n`).join('') + pairsReportText(result, undefined, typedAlpha);
  const figures = {
    'p-value': () => pValueByGammaPlot(result),
    estimate: () => estimateRangePlot(result),
    amplification: () => amplificationPlot(result),
  };
  return Object.freeze({ text, json, figures });
}
