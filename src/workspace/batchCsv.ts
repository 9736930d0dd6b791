import { BATCH_RV_NOTE, type BatchResult } from './batchFindings';
import { toSafeCsv } from '../format/csvExport';

/** Batch results as a CSV that is safe to open in a spreadsheet (one row per finding, problems included). */
export function batchCsvText(result: BatchResult): string {
  const columns = ['row', 'label', 'measure', 'estimate', 'lower', 'upper', 'se', 'df', 'e_value_estimate', 'e_value_interval', 't', 'partial_r2', 'rv', 'rv_alpha', 'rv_note', 'problem'];
  return toSafeCsv(
    columns,
    result.rows.map((r) => [r.row, r.label, r.measure, r.estimate, r.lower, r.upper, r.se, r.df, r.eValueEstimate, r.eValueInterval, r.t, r.partialR2, r.rv, r.rvAlpha, r.measure === 'coef' ? null : BATCH_RV_NOTE, r.problem || null]),
  );
}
