// 100,000 reported estimates (invented, mixed measures) from CSV text through the E-value core.
// Run: npm run bench -- bench/evalue.bench.ts
import { bench, describe } from 'vitest';
import { analyseEValue } from '../src/core/eValueAnalysis';
import type { EValueInput } from '../src/core/eValueAnalysis';
import type { EffectMeasure, OutcomePrevalence } from '../src/core/riskRatioScale';
import { readCsvText } from '../src/data/csv';
import type { CsvTable } from '../src/data/csv';
import { parseNumberText } from '../src/data/numberText';

const ROWS = 100_000;
const options = { iterations: 5, warmupIterations: 1, time: 0 };

/** A deterministic CSV of reported findings: measure, estimate, limits or SE, prevalence, SD. */
function reportedEstimatesCsv(rows: number): string {
  let seed = 20170815;
  const random = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const measures: EffectMeasure[] = ['rr', 'or', 'hr', 'smd', 'md'];
  const lines = ['measure,estimate,lower,upper,se,prevalence,sd'];
  for (let i = 0; i < rows; i++) {
    const measure = measures[i % measures.length];
    const logEstimate = (random() - 0.4) * 3;
    const se = 0.05 + random() * 0.5;
    const withSe = random() < 0.3;
    const prevalence = measure === 'or' || measure === 'hr' ? (random() < 0.5 ? 'rare' : 'common') : '';
    if (measure === 'smd' || measure === 'md') {
      const scale = measure === 'md' ? 12 : 1;
      const d = logEstimate / 2;
      const limits = withSe ? ['', ''] : [((d - 1.96 * se) * scale).toFixed(4), ((d + 1.96 * se) * scale).toFixed(4)];
      lines.push([measure, (d * scale).toFixed(4), ...limits, withSe ? (se * scale).toFixed(4) : '', '', measure === 'md' ? '12' : ''].join(','));
    } else {
      const estimate = Math.exp(logEstimate);
      const limits = withSe ? ['', ''] : [(estimate * Math.exp(-1.96 * se)).toPrecision(5), (estimate * Math.exp(1.96 * se)).toPrecision(5)];
      lines.push([measure, estimate.toPrecision(5), ...limits, withSe ? se.toFixed(4) : '', prevalence, ''].join(','));
    }
  }
  return lines.join('\n') + '\n';
}

/** Each row as the core's input; empty cells are left out. */
function rowInputs(table: CsvTable): EValueInput[] {
  const col = (name: string) => table.columns.indexOf(name);
  const [m, e, lo, up, se, prev, sd] = ['measure', 'estimate', 'lower', 'upper', 'se', 'prevalence', 'sd'].map(col);
  const num = (cell: string | null) => (cell === null ? null : parseNumberText(cell, table.decimalComma));
  return table.rows.map((row) => ({
    measure: row[m] as EffectMeasure,
    estimate: num(row[e]) as number,
    lower: num(row[lo]),
    upper: num(row[up]),
    se: num(row[se]),
    outcomePrevalence: row[prev] as OutcomePrevalence | null,
    sd: num(row[sd]),
  }));
}

const csv = reportedEstimatesCsv(ROWS);
const parsed = rowInputs(readCsvText(csv));

describe(`${ROWS.toLocaleString('en')} reported estimates`, () => {
  bench(
    'CSV text → inputs → analyseEValue',
    () => {
      const inputs = rowInputs(readCsvText(csv));
      let sum = 0;
      for (const input of inputs) sum += analyseEValue(input).eValueEstimate;
      if (!Number.isFinite(sum)) throw new Error('an E-value was not finite');
    },
    options,
  );
  bench(
    'analyseEValue alone (inputs already parsed)',
    () => {
      let sum = 0;
      for (const input of parsed) sum += analyseEValue(input).eValueEstimate;
      if (!Number.isFinite(sum)) throw new Error('an E-value was not finite');
    },
    options,
  );
  bench(
    'CSV parse alone',
    () => {
      if (readCsvText(csv).rows.length !== ROWS) throw new Error('rows lost');
    },
    options,
  );
});
