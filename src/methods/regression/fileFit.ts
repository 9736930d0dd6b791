import type { ByteSource } from '../../data/byteSource';
import { ovbSpecFromRegressionData } from './ovbRegressionData';
import { accumulateRegressionFromStream, type RegressionData, type RegressionDataSpec } from './regressionData';
import type { FileRegression, OvbFormInputs } from './request';

/** How the form's column choices read a file: outcome, treatment, chosen covariates and categorical columns. */
export function regressionSpecOf(form: OvbFormInputs, everyOtherColumn = false): RegressionDataSpec {
  const categorical = form.categorical.split(',').map((c) => c.trim()).filter((c) => c !== '');
  const covariates = form.covariates.filter((c) => c !== form.outcome && c !== form.treatment);
  return {
    outcome: form.outcome,
    treatment: form.treatment,
    ...(everyOtherColumn && form.covariates.length === 0 ? {} : { covariates }),
    ...(categorical.length > 0 ? { categorical } : {}),
  };
}

/** A file's regression, ready for the request reader, and what was read in words. */
export interface FittedFile {
  readonly fileData: FileRegression;
  readonly data: RegressionData;
  /** Rows used, dropped and dummy coding, for the page. */
  readonly note: string;
}

export function fitted(data: RegressionData): FittedFile {
  const coded = data.categorical.map((c) => `${c.column} is dummy-coded with reference level “${c.reference}”`);
  const note =
    `${data.rowsUsed.toLocaleString('en')} rows used of ${data.rowsRead.toLocaleString('en')}` +
    (data.rowsDropped > 0 ? `; ${data.rowsDropped.toLocaleString('en')} dropped for a missing value` : '') +
    '.' +
    (coded.length > 0 ? ` ${coded.join('; ')}.` : '') +
    (data.warnings.length > 0 ? ` ${data.warnings.join(' ')}` : '');
  return { fileData: { design: data.design, spec: ovbSpecFromRegressionData(data) }, data, note };
}

/** Reads a CSV stream chunk by chunk where it is (the command line) and fits the regressions. */
export async function fitFileStream(source: ByteSource, form: OvbFormInputs): Promise<FittedFile> {
  return fitted(await accumulateRegressionFromStream(source, regressionSpecOf(form, true)));
}

