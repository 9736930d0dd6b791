import { boundingFactor } from '../../core/boundingFactor';
import type { EValueResult } from '../../core/eValueAnalysis';
import { InputError } from '../../core/inputProblem';
import { readCsvText, type CsvTable } from '../../data/csv';
import type { StudyLabels } from '../../format/studyLabels';
import type { PlotSpec } from '../../plot/plotSpec';
import { jointStrengthPlot } from './jointStrengthPlot';
import { evaluateEValueForm, type EValueFormInputs, type EValueFormOutcome } from './request';
import { describeStrengthPair } from './text';

/** What the page shows for the form's current text: the outcome of the request reader and the plot. */
export interface EValueRun {
  readonly outcome: EValueFormOutcome;
  /** The joint-strength plot, or null while there is no result. */
  readonly plot: PlotSpec | null;
}

/**
 * Runs the E-value for the page: reads the form (with the loaded CSV for the file source) and draws the
 * joint-strength plot with the assessed reference confounders. Cheap enough to run on every keystroke, so no
 * Web Worker is used.
 */
export function runEValue(form: EValueFormInputs, table: CsvTable | null, study: StudyLabels): EValueRun {
  const outcome = evaluateEValueForm(form, form.source === 'file' ? table : null);
  const confounders = outcome.confounders.filter((c) => c !== null);
  const plot = outcome.result ? jointStrengthPlot(outcome.result, { study, confounders }) : null;
  return Object.freeze({ outcome, plot });
}

/**
 * The plot's readout for a pointer at strengths (x with the exposure, y with the outcome): their bounding factor
 * and what it could do to the result, in words; empty outside the plot or without a result.
 */
export function strengthPairReadout(result: EValueResult | null, x: number, y: number, inside: boolean): string {
  return result && inside ? describeStrengthPair(x, y, boundingFactor(x, y), result) : '';
}

/** A chosen file read as a CSV table, or the reason it cannot be used (named after the file). */
export type ChosenFile = { readonly table: CsvTable; readonly problem: '' } | { readonly table: null; readonly problem: string };

/** Reads the file the user chose on the page (its rows stay in the browser and are never saved). */
export async function readChosenFile(file: { readonly name: string; text(): Promise<string> }): Promise<ChosenFile> {
  try {
    return { table: readCsvText(await file.text(), 'file'), problem: '' };
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return { table: null, problem: `${file.name}: ${error.problems.map((p) => p.message).join('; ')}` };
  }
}
