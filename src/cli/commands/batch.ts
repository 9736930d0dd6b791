import { appraiseBatchStream, BATCH_COLUMNS, BATCH_MEASURES, BATCH_RV_RULE, type BatchResult } from '../../workspace/batchFindings';
import { batchCsvText } from '../../workspace/batchCsv';
import { formatNumber, formatPercent } from '../../format/formatNumber';
import type { LurkCommand } from '../defineCommand';
import { numberOption, type OptionKinds } from '../parseOptions';
import { EXIT_WITH_PROBLEMS, UsageError } from '../usageError';
import { InputError } from '../../methods/problems';
import { ALPHA_RANGE } from '../../methods/fieldReader';
import { defineCommand } from '../defineCommand';
import { printableLines } from '../../data/printable';

const OPTIONS: OptionKinds = {
  json: { type: 'boolean' },
  csv: { type: 'boolean' },
  alpha: { type: 'string' },
  'keep-going': { type: 'boolean' },
};

const HELP = `lurk batch — E-values (and robustness values) for many reported findings at once.

  lurk batch FILE [--alpha 0.05] [--json | --csv] [--keep-going]

FILE is a CSV with one reported finding per row and a header naming its columns:
  ${BATCH_COLUMNS.join(', ')}
measure is one of ${BATCH_MEASURES.join(', ')} (coef: a linear-regression coefficient: robustness values only).
measure and estimate are required; give lower and upper, or se. outcome_prevalence (rare or common) is required
for odds and hazard ratios; sd for a mean difference.
${BATCH_RV_RULE} A robustness value is defined for a coefficient's t in a linear
regression (Cinelli & Hazlett 2020), not for a log risk, odds or hazard ratio.
A row with a problem is reported with its problem; the other rows are still computed. FILE "-" is standard input.

  --alpha       significance level for the robustness value RV at level alpha, coef rows (default 0.05; 1e-12 to 0.5)
  --json        one JSON object: {rows: [...], computed, withProblems, alpha, warnings}. In each row, problem is
                null when the row was read, and estimate, lower, upper, se, df, eValueEstimate, eValueInterval,
                t, partialR2, rv and rvAlpha are null when the row does not give them
  --csv         a CSV of the results, safe to open in a spreadsheet (text that would run as a formula is neutralised)
  --keep-going  exit with status 0 even when some rows have problems

Exit status: 0 every row computed; 2 bad input (options, or a file that cannot be read as a table of findings);
3 the results are printed but some rows have problems (unless --keep-going).

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
    if (!(alpha >= ALPHA_RANGE.low && alpha <= ALPHA_RANGE.high)) {
      throw new UsageError('--alpha', `must be between ${ALPHA_RANGE.low} and ${ALPHA_RANGE.high} (a significance level), got ${alpha}`);
    }
    // Rows are appraised as the file streams by (memory: one chunk of the file, plus the results).
    const result = await asFileProblem(() => appraiseBatchStream(io.openStream(positionals[0]), alpha), positionals[0]);
    if (values.json) io.out(JSON.stringify(result, null, 2) + '\n');
    else if (values.csv) io.out(batchCsvText(result));
    else io.out(printableLines(batchReport(result)));
    const withProblems = result.rows.filter((r) => r.problem).length;
    if (withProblems === 0 || values['keep-going']) return 0;
    io.err(`lurk batch: ${withProblems} of ${result.rows.length} rows have problems (listed with the results; --keep-going exits 0)\n`);
    return EXIT_WITH_PROBLEMS;
  },
});

/** Problems of the file as a whole are named by the FILE argument (the command has no --file option). */
async function asFileProblem<T>(read: () => Promise<T>, path: string): Promise<T> {
  try {
    return await read();
  } catch (error) {
    if (error instanceof InputError) throw new UsageError('FILE', error.problems[0]?.message ?? 'cannot be read as a table of findings');
    if (typeof (error as NodeJS.ErrnoException).code === 'string') throw new UsageError('FILE', `cannot read "${path}"`);
    throw error;
  }
}

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
