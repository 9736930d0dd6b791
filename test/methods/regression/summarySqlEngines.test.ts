import { afterAll, beforeAll, describe, it } from 'vitest';
import { designFromCrossProducts } from '../../../src/core/crossProductFit';
import { ovbRegressionSummary } from '../../../src/core/ovbRegression';
import { regressionDataFromText } from '../../../src/methods/regression/regressionData';
import { ovbSpecFromRegressionData } from '../../../src/methods/regression/ovbRegressionData';
import { crossProductsFromSqlRow, summaryStatisticsSql, type SummaryVariable } from '../../../src/methods/regression/summaryStatisticsSql';
import { expectClose } from '../../support/expectClose';
import { readReferenceText } from '../../support/reference';
import { duckDbEngine, postgresEngine, type SqlEngine, type TestColumn } from '../../support/sqlEngines';

// The reference is the CSV path (QR on the raw rows; itself checked against R's lm and NIST StRD in test/core).
// Data: a fictional study with large means and small spread (a treatment around 10⁶ with SD 1, a calendar
// year, an identifier-like covariate), with missing values; and NIST's Longley data (test/reference/longley.csv).
const N = 400;
const wave = (i: number, a: number, b: number) => Math.sin(i * a + b);
const dose = Array.from({ length: N }, (_, i) => 1_000_000 + wave(i, 0.37, 0.1));
const year = Array.from({ length: N }, (_, i) => 2000 + (i % 23) + 0.5 * wave(i, 1.7, 0.3));
const site = Array.from({ length: N }, (_, i) => 100_000 + ((i * 7) % 11) + 0.1 * wave(i, 2.3, 0.5));
const response = dose.map((d, i) => 3 + 0.8 * (d - 1_000_000) + 0.05 * (year[i] - 2000) + 0.3 * (site[i] - 100_000) + 0.7 * wave(i, 0.91, 0.2));
const withGaps = <T>(values: T[], every: number, offset: number) => values.map((v, i) => (i % every === offset ? null : v));
const columns: TestColumn[] = [
  { name: 'dose', type: 'DOUBLE PRECISION', values: withGaps(dose, 31, 4) },
  { name: 'year', type: 'DOUBLE PRECISION', values: year },
  { name: 'site id', type: 'DOUBLE PRECISION', values: withGaps(site, 37, 9) },
  { name: 'response', type: 'DOUBLE PRECISION', values: response },
];
const csv = [columns.map((c) => `"${c.name}"`).join(','), ...dose.map((_, i) => columns.map((c) => (c.values[i] === null ? 'NA' : (c.values[i] as number).toPrecision(17))).join(','))].join('\n');

function compare(fromSql: ReturnType<typeof ovbRegressionSummary>, fromCsv: ReturnType<typeof ovbRegressionSummary>, rel: number) {
  expectClose(fromSql.estimate, fromCsv.estimate, { rel }, 'estimate');
  expectClose(fromSql.se, fromCsv.se, { rel }, 'se');
  expectClose(fromSql.df, fromCsv.df, { rel: 0 }, 'df');
  fromCsv.benchmarks.forEach((b, i) => {
    expectClose(fromSql.benchmarks[i].r2yxj!, b.r2yxj!, { rel, abs: 1e-15 }, `R²yxj ${b.covariate}`);
    expectClose(fromSql.benchmarks[i].r2dxj!, b.r2dxj!, { rel, abs: 1e-15 }, `R²dxj ${b.covariate}`);
  });
}

function csvSummary(text: string, outcome: string, treatment: string, covariates: string[]) {
  const data = regressionDataFromText(text, { outcome, treatment, covariates });
  return { data, summary: ovbRegressionSummary(data.design, ovbSpecFromRegressionData(data)) };
}

async function sqlSummary(engine: SqlEngine, table: string, outcome: string, treatment: string, covariates: string[], spec: ReturnType<typeof ovbSpecFromRegressionData>) {
  const variables: SummaryVariable[] = [...covariates, treatment, outcome].map((column) => ({ column }));
  const row = await engine.row(summaryStatisticsSql({ table, variables }));
  return ovbRegressionSummary(designFromCrossProducts(crossProductsFromSqlRow(row, variables)), spec);
}

const engines: Array<[string, () => Promise<SqlEngine>]> = [
  ['DuckDB', duckDbEngine],
  ['PostgreSQL', postgresEngine],
];

describe.each(engines)('the regression push-down on %s equals the CSV path to 1e-9', (_name, open) => {
  let engine: SqlEngine;
  beforeAll(async () => {
    engine = await open();
    await engine.table(['warehouse', 'visits'], columns);
    const longley = readReferenceText('longley.csv').trim().split(/\r?\n/);
    const header = longley[0].split(',').map((h) => h.replace(/"/g, ''));
    const rows = longley.slice(1).map((l) => l.split(',').map(Number));
    await engine.table(['longley'], header.map((name, j) => ({ name, type: 'DOUBLE PRECISION' as const, values: rows.map((r) => r[j]) })));
  }, 120_000);
  afterAll(async () => engine?.close());

  it('on data with large means and small spread, missing values, from a schema-qualified table', async () => {
    const { data, summary } = csvSummary(csv, 'response', 'dose', ['year', 'site id']);
    const fromSql = await sqlSummary(engine, 'warehouse.visits', 'response', 'dose', ['year', 'site id'], ovbSpecFromRegressionData(data));
    compare(fromSql, summary, 1e-9);
  });

  it("on NIST's Longley data, benchmark partial R² included", async () => {
    const { data, summary } = csvSummary(readReferenceText('longley.csv'), 'y', 'x1', ['x2', 'x3', 'x4', 'x5', 'x6']);
    const fromSql = await sqlSummary(engine, 'longley', 'y', 'x1', ['x2', 'x3', 'x4', 'x5', 'x6'], ovbSpecFromRegressionData(data));
    compare(fromSql, summary, 1e-9);
  });
});
