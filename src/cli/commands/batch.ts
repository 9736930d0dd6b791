import { appraiseBatchCsv, BATCH_COLUMNS, BATCH_MEASURES, BATCH_RV_RULE, type BatchResult } from '../../workspace/batchFindings';
import { batchCsvText } from '../../workspace/batchCsv';
import { formatNumber, formatPercent } from '../../format/formatNumber';
import type { LurkCommand } from '../defineCommand';
import { numberOption, type OptionKinds } from '../parseOptions';
import { UsageError } from '../usageError';
import { readFileArgument } from '../readFileArgument';
import { defineCommand } from '../defineCommand';

const OPTIONS: OptionKinds = {
  json: { type: 'boolean' },
  csv: { type: 'boolean' },
  alpha: { type: 'string' },
};

const HELP = `lurk batch — E-values (and robustness values) for many reported findings at once.

  lurk batch FILE [--alpha 0.05] [--json | --csv]

FILE is a CSV with one reported finding per row and a header naming its columns:
  ${BATCH_COLUMNS.join(', ')}
measure is one of ${BATCH_MEASURES.join(', ')} (coef: a linear-regression coefficient: robustness values only).
measure and estimate are required; give lower and upper, or se. outcome_prevalence (rare or common) is required
for odds and hazard ratios; sd for a mean difference.
${BATCH_RV_RULE} A robustness value is defined for a coefficient's t in a linear
regression (Cinelli & Hazlett 2020), not for a log risk, odds or hazard ratio.
A row with a problem is reported with its problem; the other rows are still computed.

  --alpha  significance level for the robustness value RV at level alpha, coef rows (default 0.05)
  --json   one JSON object: {rows: [...], computed, withProblems, alpha, warnings}
  --csv    a CSV of the results, safe to open in a spreadsheet (text that would run as a formula is neutralised)

A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation.
Decisions about health or safety defer to domain experts, local guidance and licensed practice.
`;

export const command: LurkCommand = defineCommand({
  name: 'batch',
  summary: 'E-values and robustness values for a CSV of many reported findings',
  help: HELP,
  options: OPTIONS,
  async run({ values, positionals }, io) {
    if (positionals.length !== 1) throw new UsageError('FILE', 'give exactly one CSV file of reported findings');
    if (values.json && values.csv) throw new UsageError('--csv', 'choose --json or --csv, not both');
    const alpha = numberOption(values.alpha, '--alpha') ?? 0.05;
    if (!(alpha > 0 && alpha < 1)) throw new UsageError('--alpha', `must be between 0 and 1, got ${alpha}`);
    const text = await readFileArgument(io, positionals[0], 'FILE');
    const result = appraiseBatchCsv(text, alpha);
    if (values.json) io.out(JSON.stringify(result, null, 2) + '\n');
    else if (values.csv) io.out(batchCsvText(result));
    else io.out(batchReport(result));
    return 0;
  },
});

/** A readable table. */
export function batchReport(result: BatchResult): string {
  const header = ['row', 'label', 'measure', 'estimate', 'E-value', 'E-value (CI)', 'RV', `RV (α=${result.alpha})`];
  const lines = result.rows.map((r) => [
    String(r.row),
    r.label.length > 40 ? r.label.slice(0, 39) + '…' : r.label,
    r.measure,
    formatNumber(r.estimate, { missing: '—' }),
    formatNumber(r.eValueEstimate, { digits: 2, missing: '—' }),
    formatNumber(r.eValueInterval, { digits: 2, missing: '—' }),
    formatPercent(r.rv, 1, '—'),
    formatPercent(r.rvAlpha, 1, '—'),
  ]);
  const widths = header.map((h, c) => Math.max(h.length, ...lines.map((l) => l[c].length)));
  const row = (cells: string[]) => cells.map((cell, c) => (c <= 2 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join('  ');
  const out = [row(header), widths.map((w) => '-'.repeat(w)).join('  '), ...lines.map(row)];
  const problems = result.rows.filter((r) => r.problem);
  if (problems.length > 0) out.push('', 'Problems:', ...problems.map((r) => `  row ${r.row}: ${r.problem}`));
  if (result.warnings.length > 0) out.push('', ...result.warnings.map((w) => `Note: ${w}`));
  out.push(
    '',
    `${result.computed} of ${result.rows.length} findings have an E-value or a robustness value.`,
    BATCH_RV_RULE,
    'An E-value bounds how strong hidden confounding would have to be; it does not prove causation.',
    '',
  );
  return out.join('\n');
}
