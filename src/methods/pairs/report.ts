import type { PairsResult } from '../../core/pairsAnalysis';
import type { CommandReport } from '../methodModule';
import { PAIRS_CAUTION, pairsReportText, pairsResultJson } from './text';

/**
 * The command's report of a matched-pairs result: the text for people (the reader's notes first, e.g. rows left
 * out for a missing value) and the JSON object (the result's fields, every warning, and the caution).
 */
export function pairsReport(result: PairsResult, readWarnings: readonly string[] = [], typedAlpha?: string): CommandReport {
  const json = pairsResultJson(result);
  json.warnings = [...readWarnings, ...result.warnings];
  json.caution = PAIRS_CAUTION;
  const text = readWarnings.map((w) => `Note: ${w}\n`).join('') + pairsReportText(result, undefined, typedAlpha);
  return Object.freeze({ text, json });
}
