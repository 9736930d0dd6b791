import { readCsvHeadColumns } from '../../data/csvHead';
import { adjustForConfounder } from '../../core/confounderAdjustment';
import { InputError } from '../../core/inputProblem';
import type { OvbResult } from '../../core/ovbAnalysis';
import { formatNumber, formatPercent } from '../../format/formatNumber';
import type { StudyLabels } from '../../format/studyLabels';
import type { PlotSpec } from '../../plot/plotSpec';
import { ovbContourPlot } from './ovbContourPlot';
import { ovbExtremeScenarioPlot } from './ovbExtremeScenarioPlot';
import type { RegressionProgress } from './regressionData';
import { fitted, regressionSpecOf, type FittedFile } from './fileFit';
import { runRegressionInWorker } from './regressionWorkerClient';
import type { OvbFormInputs } from './request';

export type { FittedFile } from './fileFit';

/** The columns of a chosen file, from its first rows, or the reason it cannot be read. */
export const readFileColumns = readCsvHeadColumns;

/**
 * Reads a whole CSV in a Web Worker, chunk by chunk (the page), and fits the regressions.
 * @throws InputError for problems in the file or the column choice; AbortError when aborted
 */
export async function fitFileInWorker(
  file: Blob,
  form: OvbFormInputs,
  options: { signal?: AbortSignal; onProgress?: (progress: RegressionProgress) => void } = {},
): Promise<FittedFile> {
  return fitted(await runRegressionInWorker(file, regressionSpecOf(form), options));
}

/** The three plots of a result: contours of the adjusted estimate and t, and the extreme scenarios. */
export function ovbPlots(result: OvbResult, study: Partial<StudyLabels>, plotMax: number | undefined): { estimate: PlotSpec; t: PlotSpec; extreme: PlotSpec } {
  const axes = plotMax !== undefined ? { maxR2dz: plotMax, maxR2yz: plotMax } : {};
  return {
    estimate: ovbContourPlot(result, { kind: 'estimate', study, ...axes }),
    t: ovbContourPlot(result, { kind: 't', study, ...axes }),
    extreme: ovbExtremeScenarioPlot(result, { study, ...(plotMax !== undefined ? { maxR2dz: plotMax } : {}) }),
  };
}

/** What a confounder of the strength under the pointer would do, in words (empty outside the plot's square). */
export function ovbPointReadout(result: OvbResult, r2dz: number, r2yz: number): string {
  if (!(r2dz >= 0 && r2dz < 1 && r2yz >= 0 && r2yz <= 1)) return '';
  const a = adjustForConfounder({ estimate: result.estimate, se: result.se, df: result.df }, { r2dz, r2yz }, result.direction);
  return `R² with treatment ${formatPercent(r2dz)}, with outcome ${formatPercent(r2yz)}: adjusted estimate ${formatNumber(a.estimate, {
    significant: 3,
  })}, SE ${formatNumber(a.se, { significant: 3 })}, t ${formatNumber(a.t, { digits: 2 })}`;
}

/** Why fitting a file failed, in words for the page (cancelled, a problem in the file, or another error). */
export function fitFailureMessage(error: unknown): string {
  if (error instanceof DOMException && error.name === 'AbortError') return 'Reading was cancelled.';
  if (error instanceof InputError) return error.problems.map((p) => p.message).join(' ');
  return error instanceof Error ? error.message : String(error);
}
