import { InputError, inputProblem } from '../../core/inputProblem';
import { runBootstrapChunk, type BootstrapChunk } from '../../core/weightingBootstrap';
import { finishWeighting, type WeightingResult } from '../../core/weightingAnalysis';
import { prepareWeighting, type PreparedWeighting } from '../../core/weightingPreparation';
import { formFieldOf, type WeightingSettings } from './request';
import { weightingInputOf, type WeightingRead, type WeightingReadSummary } from './weightingData';

/** A finished weighting analysis: the core's result and the propensity model's coefficient standard errors. */
export interface WeightingAnalysis {
  readonly result: WeightingResult;
  /** One per coefficient (intercept first); null where the information matrix gives none. */
  readonly standardErrors: readonly (number | null)[];
}

/**
 * Validates and prepares the analysis of the columns read (propensity fit, trimming), with every problem named
 * by a form field (`covariates`, `trimBelow`, `lambdas`, …) and, for a covariate, by its column in the message.
 * @throws InputError with the problems
 */
export function prepareFromRead(settings: WeightingSettings, read: WeightingRead): PreparedWeighting {
  const input = weightingInputOf(settings, read);
  try {
    return prepareWeighting(input);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    throw new InputError(
      error.problems.map((p) => {
        const m = /^covariates\[(\d+)\]/.exec(p.field);
        const name = m ? input.covariates[Number(m[1])]?.name : undefined;
        const message = name !== undefined && !p.message.includes(`"${name}"`) ? `"${name}": ${p.message}` : p.message;
        return inputProblem(formFieldOf(p.field), p.code, message, p.value);
      }),
    );
  }
}

/**
 * The result and the standard errors from a prepared analysis and its bootstrap chunks (any split). The
 * standard errors' module (and mathjs, which takes seconds to load) is imported only here, so that starting
 * the command line or the page does not wait for it.
 */
export async function finishAnalysis(prepared: PreparedWeighting, chunks: readonly BootstrapChunk[]): Promise<WeightingAnalysis> {
  const result = finishWeighting(prepared, chunks);
  const { logisticStandardErrors } = await import('../../core/logisticStandardErrors');
  const standardErrors = Object.freeze(logisticStandardErrors(prepared.design, prepared.columnCount, prepared.propensities));
  return Object.freeze({ result, standardErrors });
}

/**
 * Runs every resample of a prepared analysis in this thread, in pieces of `pieceSize` so progress can be
 * reported and a cancel request honoured between resamples. The page's worker uses it; the result equals a
 * single chunk's (each resample has its own random stream).
 * @returns the chunks, or null when cancelled
 */
export function bootstrapInPieces(
  prepared: PreparedWeighting,
  options: { readonly onProgress?: (done: number, total: number) => void; readonly isCancelled?: () => boolean; readonly pieceSize?: number } = {},
): BootstrapChunk[] | null {
  const total = prepared.bootstrap;
  const size = Math.max(1, options.pieceSize ?? 25);
  const chunks: BootstrapChunk[] = [];
  for (let start = 0; start < total; start += size) {
    const count = Math.min(size, total - start);
    const chunk = runBootstrapChunk(prepared, { start, count }, { isCancelled: options.isCancelled, onProgress: (done) => options.onProgress?.(start + done, total) });
    chunks.push(chunk);
    if (chunk.count < count) return null;
  }
  return chunks;
}

/** The one-line note of what was read from a file, for the page and the report. */
export function readNote(read: WeightingReadSummary): string {
  const coded = read.coded.map((c) => `"${c.column}" is dummy-coded (${c.levels} levels, reference level "${c.reference ?? ''}")`);
  return `${read.rowsRead.toLocaleString('en')} rows read; treatment "${read.treatment}", outcome "${read.outcome}", covariates ${
    read.covariates.length > 0 ? read.covariates.map((c) => `"${c}"`).join(', ') : 'none'
  }.` + (coded.length > 0 ? ` ${coded.join('; ')}.` : '');
}
