import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import type { CommandReport } from '../methodModule';
import { SETS_CAUTION, setsReportText, setsResultJson } from './text';

/**
 * The command's report of a matched-sets result: the text for people (the reader's notes first, e.g. padded
 * short rows) and the JSON object (the result's fields, every warning, and the caution), shaped as `lurk pairs`'s.
 */
export function setsReport(result: MatchedSetsResult, readWarnings: readonly string[] = []): CommandReport {
  const json = setsResultJson(result);
  json.warnings = [...readWarnings, ...result.warnings];
  json.caution = SETS_CAUTION;
  const text = readWarnings.map((w) => `Note: ${w}\n`).join('') + setsReportText(result);
  return Object.freeze({ text, json });
}
